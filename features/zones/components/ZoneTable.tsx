import type { Measure, Range, Zone } from "../lib/zones";
import { formatPace, paceSPerKm } from "../lib/zones";

const SWATCH: Record<number, string> = { 1: "bg-zone-1", 2: "bg-zone-2", 3: "bg-zone-3" };

function fmt(measure: Measure, v: number): string {
  if (measure === "hrBpm") return `${Math.round(v)}`;
  if (measure === "powerW") return `${Math.round(v)}`;
  return v.toFixed(1);
}

function rangeText(measure: Measure, r: Range | undefined): string {
  if (!r) return "—";
  const unit = measure === "hrBpm" ? "bpm" : measure === "powerW" ? "W" : "km/h";
  if (r.min === null && r.max !== null) return `below ${fmt(measure, r.max)} ${unit}`;
  if (r.max === null && r.min !== null) return `${fmt(measure, r.min)} ${unit} and above`;
  return `${fmt(measure, r.min!)}–${fmt(measure, r.max!)} ${unit}`;
}

function paceText(r: Range | undefined): string {
  if (!r) return "—";
  // Faster speed = shorter pace: the bounds swap.
  if (r.min === null && r.max !== null) return `slower than ${formatPace(paceSPerKm(r.max))}`;
  if (r.max === null && r.min !== null) return `${formatPace(paceSPerKm(r.min))} and faster`;
  return `${formatPace(paceSPerKm(r.max!))} – ${formatPace(paceSPerKm(r.min!))}`;
}

/** A zone table: the zone number always printed beside its colour, every number with its unit. */
export function ZoneTable({ zones, caption }: { zones: Zone[]; caption: string }) {
  const measures = (Object.keys(zones[0]?.ranges ?? {}) as Measure[]).filter((m) => zones.some((z) => z.ranges[m]));
  return (
    <table className="w-full border-collapse text-left text-sm" data-testid="zone-table">
      <caption className="mb-2 text-left text-sm font-semibold">{caption}</caption>
      <thead>
        <tr className="border-b border-rule text-ink-soft">
          <th scope="col" className="py-2 pr-3 font-semibold">Zone</th>
          {measures.includes("hrBpm") ? <th scope="col" className="py-2 pr-3 font-semibold">Heart rate</th> : null}
          {measures.includes("powerW") ? <th scope="col" className="py-2 pr-3 font-semibold">Power</th> : null}
          {measures.includes("speedKmh") ? <th scope="col" className="py-2 pr-3 font-semibold">Speed</th> : null}
          {measures.includes("speedKmh") ? <th scope="col" className="py-2 pr-3 font-semibold">Pace</th> : null}
          <th scope="col" className="py-2 pr-3 font-semibold">RPE (CR-10)</th>
        </tr>
      </thead>
      <tbody>
        {zones.map((z) => (
          <tr key={z.zone} className="border-b border-rule/70">
            <th scope="row" className="py-2 pr-3 font-semibold">
              <span className="flex items-center gap-2">
                <span aria-hidden className={`inline-block h-4 w-4 rounded-sm border border-ink/20 ${SWATCH[z.parent]}`} />
                {z.name}
              </span>
            </th>
            {measures.includes("hrBpm") ? <td className="num py-2 pr-3">{rangeText("hrBpm", z.ranges.hrBpm)}</td> : null}
            {measures.includes("powerW") ? <td className="num py-2 pr-3">{rangeText("powerW", z.ranges.powerW)}</td> : null}
            {measures.includes("speedKmh") ? <td className="num py-2 pr-3">{rangeText("speedKmh", z.ranges.speedKmh)}</td> : null}
            {measures.includes("speedKmh") ? <td className="num py-2 pr-3">{paceText(z.ranges.speedKmh)}</td> : null}
            <td className="num py-2 pr-3">{z.rpe[0]}–{z.rpe[1]}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
