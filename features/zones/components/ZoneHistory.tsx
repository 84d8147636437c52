import Link from "next/link";
import { SPORT_LABELS } from "@/features/platform/lib/sports";
import type { ZoneSetView } from "../lib/views";
import { ZoneTable } from "./ZoneTable";

function sportName(s: string): string {
  return (SPORT_LABELS as Record<string, string>)[s] ?? s;
}

export function ZonesInForce({ inForce, emptyText }: { inForce: Record<string, ZoneSetView>; emptyText: string }) {
  const sets = Object.values(inForce);
  if (!sets.length) return <p className="text-ink-soft">{emptyText}</p>;
  return (
    <div className="space-y-6">
      {sets.map((z) => (
        <div key={z.id} className="space-y-3">
          <ZoneTable
            zones={z.zones}
            caption={`${sportName(z.sport)} · effective from ${z.effectiveFrom} · from a ${z.source}`}
          />
          {z.fiveZones ? (
            <ZoneTable zones={z.fiveZones} caption={`${sportName(z.sport)} · five-zone subdivision`} />
          ) : null}
        </div>
      ))}
    </div>
  );
}

export function ZoneSetList({ history }: { history: ZoneSetView[] }) {
  if (!history.length) return null;
  return (
    <table className="w-full text-left text-sm">
      <caption className="mb-2 text-left font-semibold">Zone history</caption>
      <thead>
        <tr className="border-b border-rule text-ink-soft">
          <th scope="col" className="py-1 pr-3">
            Effective from
          </th>
          <th scope="col" className="py-1 pr-3">
            Sport
          </th>
          <th scope="col" className="py-1 pr-3">
            VT1
          </th>
          <th scope="col" className="py-1 pr-3">
            VT2
          </th>
          <th scope="col" className="py-1 pr-3">
            Source
          </th>
        </tr>
      </thead>
      <tbody>
        {history.map((z) => (
          <tr key={z.id} className="border-b border-rule/60">
            <td className="num py-1 pr-3">{z.effectiveFrom}</td>
            <td className="py-1 pr-3">{sportName(z.sport)}</td>
            <td className="num py-1 pr-3">{describe(z.vt1)}</td>
            <td className="num py-1 pr-3">{describe(z.vt2)}</td>
            <td className="py-1 pr-3">
              {z.testId ? (
                <Link href={`/tests/${z.testId}`} className="text-tide underline">
                  {z.source}
                </Link>
              ) : (
                z.source
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function describe(v: ZoneSetView["vt1"]): string {
  const parts: string[] = [];
  if (v.hrBpm != null) parts.push(`${v.hrBpm} bpm`);
  if (v.powerW != null) parts.push(`${v.powerW} W`);
  if (v.speedKmh != null) parts.push(`${v.speedKmh} km/h`);
  return parts.join(" · ") || "—";
}
