import Link from "next/link";
import { requirePageActor } from "@/features/access/server/current";
import { coachedSquadIds, isHeadCoachOf } from "@/features/access/lib/rules";
import { describeMe } from "@/features/squads/server/squads";
import { InvitePanel } from "@/features/squads/components/InvitePanel";
import { AddManagedAthlete } from "@/features/squads/components/ManagedAthleteForms";
import { RosterTable } from "@/features/squads/components/RosterTable";
import { fakeEmailOutboxUrl, localOutboxEnabled } from "@/features/messages/server/list";

export const metadata = { title: "Roster" };

export default async function RosterPage({ searchParams }: { searchParams: Promise<{ squad?: string }> }) {
  const actor = await requirePageActor("/roster");
  const coached = new Set(coachedSquadIds(actor));
  const me = await describeMe(actor);
  const squads = me.squads.filter((s) => coached.has(s.id));
  if (squads.length === 0) {
    return (
      <div className="mx-auto max-w-lg card space-y-3" role="alert">
        <h1 className="text-xl font-bold">The roster is for coaches</h1>
        <p>Your account is not a coach of any squad, so there is no roster to show.</p>
        <p className="flex gap-3">
          {actor.memberships.some((m) => m.role === "athlete") ? (
            <Link href="/today" className="btn">
              Go to today
            </Link>
          ) : null}
          <Link href="/squads/new" className="btn-quiet">
            Start a squad of your own
          </Link>
        </p>
      </div>
    );
  }
  const wanted = (await searchParams).squad;
  const squad = squads.find((s) => s.id === wanted) ?? squads[0]!;
  const manages = isHeadCoachOf(actor, squad.id);
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-sm font-semibold uppercase tracking-widest text-tide">Roster</p>
          <h1 className="text-3xl font-bold">{squad.name}</h1>
          <p className="mt-1 text-sm">
            <Link href={`/roster/week?squad=${squad.id}`} className="text-tide underline">
              The squad&apos;s week: every athlete&apos;s plan side by side
            </Link>
          </p>
        </div>
        {squads.length > 1 ? (
          <nav aria-label="Squads" className="flex gap-2 text-sm">
            {squads.map((s) => (
              <Link
                key={s.id}
                href={`/roster?squad=${s.id}`}
                aria-current={s.id === squad.id ? "page" : undefined}
                className={s.id === squad.id ? "btn" : "btn-quiet"}
              >
                {s.name}
              </Link>
            ))}
          </nav>
        ) : null}
      </div>
      <div className="space-y-6">
        <section className="card" aria-label="Athletes">
          <RosterTable squadId={squad.id} />
        </section>
        {manages ? (
          <div className="max-w-xl">
            <InvitePanel squadId={squad.id} fakeInbox={localOutboxEnabled() ? fakeEmailOutboxUrl() : null} />
          </div>
        ) : null}
        <div className="max-w-xl">
          <AddManagedAthlete squadId={squad.id} />
        </div>
      </div>
    </div>
  );
}
