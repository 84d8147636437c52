"use client";
import Link from "next/link";
import { SPORT_LABELS } from "@/features/athletes/schemas";
import { useRoster } from "../api";

function sportLabel(s: string): string {
  return (SPORT_LABELS as Record<string, string>)[s] ?? s;
}

export function RosterTable({ squadId }: { squadId: string }) {
  const { data, isPending, isError, error, refetch } = useRoster(squadId);
  if (isPending) {
    return (
      <p role="status" className="py-6 text-ink-soft">
        Loading the roster…
      </p>
    );
  }
  if (isError) {
    return (
      <div role="alert" className="rounded-md border border-alert/40 bg-alert-wash p-4 text-alert">
        The roster could not be loaded: {error.message}{" "}
        <button type="button" className="font-semibold underline" onClick={() => refetch()}>
          Try again
        </button>
      </div>
    );
  }
  if (data.length === 0) {
    return <p className="py-6 text-ink-soft">No athletes in this squad yet. Invite your first athlete with the form beside the roster.</p>;
  }
  return (
    <table className="w-full border-collapse text-left text-sm" aria-label="Athletes of the squad">
      <caption className="sr-only">Athletes</caption>
      <thead>
        <tr className="border-b border-rule text-ink-soft">
          <th scope="col" className="py-2 pr-4 font-semibold">Athlete</th>
          <th scope="col" className="py-2 pr-4 font-semibold">E-mail</th>
          <th scope="col" className="py-2 pr-4 font-semibold">Sports</th>
        </tr>
      </thead>
      <tbody>
        {data.map((a) => (
          <tr key={a.id} className="border-b border-rule/70 hover:bg-tide-wash/60" data-testid="roster-row">
            <td className="py-2 pr-4 font-semibold">
              <Link href={`/athletes/${a.id}`} className="text-tide hover:underline">{a.name}</Link>
            </td>
            <td className="py-2 pr-4 text-ink-soft">{a.email}</td>
            <td className="py-2 pr-4">{a.sports.length ? a.sports.map(sportLabel).join(", ") : <span className="text-ink-soft">not set</span>}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
