import Link from "next/link";
import { Day } from "@/features/platform/components/dates";
import { SPORT_LABELS } from "@/features/platform/lib/sports";
import type { ZoneSetView } from "../lib/views";
import { ChooseZoneSet } from "./ChooseZoneSet";
import { ZoneTable } from "./ZoneTable";
import { speedStyle, speedText, type Units } from "@/features/platform/lib/units";

function sportName(s: string): string {
  return (SPORT_LABELS as Record<string, string>)[s] ?? s;
}

export function ZonesInForce({
  inForce,
  emptyText,
  units = "metric",
  maxHrBpm,
}: {
  inForce: Record<string, ZoneSetView>;
  emptyText: string;
  units?: Units;
  maxHrBpm?: number | null;
}) {
  const sets = Object.values(inForce);
  if (!sets.length) return <p className="text-ink-soft">{emptyText}</p>;
  return (
    <div className="space-y-6">
      {sets.map((z) => (
        <div key={z.id} className="space-y-3">
          <ZoneTable
            zones={z.zones}
            sport={z.sport}
            units={units}
            maxHrBpm={maxHrBpm}
            caption={
              <>
                {sportName(z.sport)} · effective from <Day value={z.effectiveFrom} /> · from a {z.source}
              </>
            }
          />
          {z.fiveZones ? (
            <ZoneTable
              zones={z.fiveZones}
              sport={z.sport}
              units={units}
              maxHrBpm={maxHrBpm}
              caption={`${sportName(z.sport)} · five-zone subdivision`}
            />
          ) : null}
        </div>
      ))}
    </div>
  );
}

/**
 * The athlete's zone sets, newest first. Where two sets of one sport share a day, the one in force is marked and, for a
 * coach, each other one offers to take its place (they would otherwise be chosen silently).
 */
export function ZoneSetList({
  history,
  canChoose = false,
  units = "metric",
}: {
  history: ZoneSetView[];
  canChoose?: boolean;
  units?: Units;
}) {
  if (!history.length) return null;
  // The list is newest first with the chosen set first on its day: the first of each sport and day is in force.
  const firstOfDay = new Map<string, string>();
  const count = new Map<string, number>();
  for (const z of history) {
    const k = `${z.sport}|${z.effectiveFrom}`;
    if (!firstOfDay.has(k)) firstOfDay.set(k, z.id);
    count.set(k, (count.get(k) ?? 0) + 1);
  }
  const shared = history.some((z) => (count.get(`${z.sport}|${z.effectiveFrom}`) ?? 0) > 1);
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
          {shared ? (
            <th scope="col" className="py-1 pr-3">
              Same day
            </th>
          ) : null}
        </tr>
      </thead>
      <tbody>
        {history.map((z) => (
          <tr key={z.id} className="border-b border-rule/60">
            <td className="num py-1 pr-3">
              <Day value={z.effectiveFrom} />
            </td>
            <td className="py-1 pr-3">{sportName(z.sport)}</td>
            <td className="num py-1 pr-3">{describe(z.vt1, z.sport, units)}</td>
            <td className="num py-1 pr-3">{describe(z.vt2, z.sport, units)}</td>
            <td className="py-1 pr-3">
              {z.testId ? (
                <Link href={`/tests/${z.testId}`} className="text-tide underline">
                  {z.source}
                </Link>
              ) : (
                z.source
              )}
            </td>
            {shared ? (
              <td className="py-1 pr-3">
                {(count.get(`${z.sport}|${z.effectiveFrom}`) ?? 0) < 2 ? null : firstOfDay.get(
                    `${z.sport}|${z.effectiveFrom}`,
                  ) === z.id ? (
                  <span className="font-semibold">In force{z.chosenAt ? " (chosen)" : " (the newest)"}</span>
                ) : canChoose ? (
                  <ChooseZoneSet id={z.id} date={z.effectiveFrom} />
                ) : (
                  <span className="text-ink-soft">Not used</span>
                )}
              </td>
            ) : null}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function describe(v: ZoneSetView["vt1"], sport: string, units: Units): string {
  const parts: string[] = [];
  if (v.hrBpm != null) parts.push(`${v.hrBpm} bpm`);
  if (v.powerW != null) parts.push(`${v.powerW} W`);
  if (v.speedKmh != null) parts.push(speedText(v.speedKmh, speedStyle(sport, units)));
  return parts.join(" · ") || "—";
}
