import { formatPace, paceSPerKm, type Measure, type Range, type Zone } from "./zones";

function fmt(measure: Measure, v: number): string {
  return measure === "speedKmh" ? v.toFixed(1) : `${Math.round(v)}`;
}

export const MEASURE_UNITS: Record<Measure, string> = { hrBpm: "bpm", powerW: "W", speedKmh: "km/h" };

export function rangeText(measure: Measure, r: Range | undefined): string {
  if (!r) return "—";
  const unit = MEASURE_UNITS[measure];
  if (r.min === null && r.max !== null) return `below ${fmt(measure, r.max)} ${unit}`;
  if (r.max === null && r.min !== null) return `${fmt(measure, r.min)} ${unit} and above`;
  return `${fmt(measure, r.min!)}–${fmt(measure, r.max!)} ${unit}`;
}

export function paceText(r: Range | undefined): string {
  if (!r) return "—";
  // Faster speed = shorter pace: the bounds swap.
  if (r.min === null && r.max !== null) return `slower than ${formatPace(paceSPerKm(r.max))}`;
  if (r.max === null && r.min !== null) return `${formatPace(paceSPerKm(r.min))} and faster`;
  return `${formatPace(paceSPerKm(r.max!))} – ${formatPace(paceSPerKm(r.min!))}`;
}

/** A step's target in the athlete's own numbers: heart rate, power and, for speed sports, pace. */
export function targetText(zone: Zone | undefined, sport: string): string | null {
  if (!zone) return null;
  const parts: string[] = [];
  if (zone.ranges.hrBpm) parts.push(rangeText("hrBpm", zone.ranges.hrBpm));
  if (zone.ranges.powerW) parts.push(rangeText("powerW", zone.ranges.powerW));
  if (zone.ranges.speedKmh)
    parts.push(sport === "cycling" ? rangeText("speedKmh", zone.ranges.speedKmh) : paceText(zone.ranges.speedKmh));
  return parts.length ? parts.join(" · ") : null;
}
