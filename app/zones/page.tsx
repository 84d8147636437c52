import { formatDay } from "@/features/platform/lib/date-format";
import Link from "next/link";
import { requirePageActor } from "@/features/access/server/current";
import { listTests } from "@/features/athlete-tests/server/tests";
import { KIND_LABELS } from "@/features/athlete-tests/components/TestSummary";
import { ZoneSetList, ZonesInForce } from "@/features/zones/components/ZoneHistory";
import { getZones } from "@/features/zones/server/zone-sets";
import { getAthleteProfile } from "@/features/athletes/server/profile";

export const metadata = { title: "My zones" };

export default async function MyZonesPage() {
  const actor = await requirePageActor("/zones");
  if (!actor.memberships.some((m) => m.role === "athlete")) {
    return (
      <div className="mx-auto max-w-lg card">
        <h1 className="text-xl font-bold">Zones belong to athletes</h1>
        <p className="mt-2">Open an athlete from the roster to see their zones.</p>
      </div>
    );
  }
  const [zones, tests, { profile }] = await Promise.all([
    getZones(actor, actor.userId),
    listTests(actor, actor.userId),
    getAthleteProfile(actor, actor.userId),
  ]);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">My zones</h1>
      <section className="card space-y-4" aria-label="Zones in force">
        <ZonesInForce
          units={actor.units}
          maxHrBpm={profile.maxHrBpm}
          inForce={zones.inForce}
          emptyText="No zones yet: your coach derives them from a test."
        />
        <ZoneSetList units={actor.units} history={zones.history} />
      </section>
      <section className="card" aria-labelledby="my-tests">
        <h2 id="my-tests" className="mb-2 text-lg font-bold">
          My tests
        </h2>
        {tests.length ? (
          <ul className="space-y-1">
            {tests.map((t) => (
              <li key={t.id}>
                <Link href={`/tests/${t.id}`} className="text-tide underline">
                  {KIND_LABELS[t.kind]} · {formatDay(t.date, actor.dateStyle)}
                </Link>
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-ink-soft">No tests yet.</p>
        )}
        <p className="mt-3 text-sm">
          <Link href={`/athletes/${actor.userId}/screening`} className="font-semibold text-tide underline">
            Readiness questions before a test
          </Link>
        </p>
      </section>
    </div>
  );
}
