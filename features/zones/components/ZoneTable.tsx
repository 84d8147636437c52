import type { ReactNode } from "react";
import { plainSpeed, speedStyle, type Units } from "@/features/platform/lib/units";
import { withShownFloor, type Measure, type Zone } from "../lib/zones";
import { rangeText, speedRangeText } from "../lib/format";

const SWATCH: Record<number, string> = { 1: "bg-zone-1", 2: "bg-zone-2", 3: "bg-zone-3" };

/**
 * A zone table: the zone number always printed beside its colour, every number with its unit, speeds as the sport says
 * them in the reader's units (pace and speed for running, speed for cycling, the split for rowing, pace per 100 for
 * swimming; platform/lib/units.ts).
 */
export function ZoneTable({
  zones: given,
  caption,
  sport,
  units = "metric",
  maxHrBpm,
}: {
  zones: Zone[];
  caption: ReactNode;
  sport: string;
  units?: Units;
  /** The athlete's maximal heart rate: zone 1 then reads from its light-intensity floor (zones.ts `withShownFloor`). */
  maxHrBpm?: number | null;
}) {
  const zones = withShownFloor(given, maxHrBpm);
  const measures = (Object.keys(zones[0]?.ranges ?? {}) as Measure[]).filter((m) => zones.some((z) => z.ranges[m]));
  const style = speedStyle(sport, units);
  // Beside a pace per km or mile, the plain speed too (a treadmill is set in km/h or mph); a split or a swim pace stands
  // alone.
  const second = style.kind === "pace" && style.metres >= 1000 ? plainSpeed(units) : null;
  return (
    <table className="w-full border-collapse text-left text-sm" data-testid="zone-table">
      <caption className="mb-2 text-left text-sm font-semibold">{caption}</caption>
      <thead>
        <tr className="border-b border-rule text-ink-soft">
          <th scope="col" className="py-2 pr-3 font-semibold">
            Zone
          </th>
          {measures.includes("hrBpm") ? (
            <th scope="col" className="py-2 pr-3 font-semibold">
              Heart rate
            </th>
          ) : null}
          {measures.includes("powerW") ? (
            <th scope="col" className="py-2 pr-3 font-semibold">
              Power
            </th>
          ) : null}
          {measures.includes("speedKmh") ? (
            <th scope="col" className="py-2 pr-3 font-semibold">
              {style.label}
            </th>
          ) : null}
          {measures.includes("speedKmh") && second ? (
            <th scope="col" className="py-2 pr-3 font-semibold">
              {second.label}
            </th>
          ) : null}
          <th scope="col" className="py-2 pr-3 font-semibold">
            RPE (CR-10)
          </th>
        </tr>
      </thead>
      <tbody>
        {zones.map((z) => (
          <tr key={z.zone} className="border-b border-rule/70">
            <th scope="row" className="py-2 pr-3 font-semibold">
              <span className="flex items-center gap-2">
                <span aria-hidden className={`inline-block h-4 w-4 rounded-sm border border-ink ${SWATCH[z.parent]}`} />
                {z.name}
              </span>
            </th>
            {measures.includes("hrBpm") ? (
              <td className="num py-2 pr-3">{rangeText("hrBpm", z.ranges.hrBpm)}</td>
            ) : null}
            {measures.includes("powerW") ? (
              <td className="num py-2 pr-3">{rangeText("powerW", z.ranges.powerW)}</td>
            ) : null}
            {measures.includes("speedKmh") ? (
              <td className="num py-2 pr-3">{speedRangeText(z.ranges.speedKmh, style)}</td>
            ) : null}
            {measures.includes("speedKmh") && second ? (
              <td className="num py-2 pr-3">{speedRangeText(z.ranges.speedKmh, second)}</td>
            ) : null}
            <td className="num py-2 pr-3">
              {z.rpe[0]}–{z.rpe[1]}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
