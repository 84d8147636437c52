import { formatPace, paceSPerKm, type Measure, type Range, type Zone } from "./zones";

function fmt(measure: Measure, v: number): string {
  return measure === "speedKmh" ? v.toFixed(1) : `${Math.round(v)}`;
}

export const MEASURE_UNITS: Record<Measure, string> = { hrBpm: "bpm", powerW: "W", speedKmh: "km/h" };

/** The step of the numbers shown: whole bpm and W, tenths of km/h. */
const STEP: Record<Measure, number> = { hrBpm: 1, powerW: 1, speedKmh: 0.1 };

/**
 * A zone's range as read: a zone holds its lower edge and stops below the next zone's (zones.ts `zoneOf`), so a closed
 * range ends one shown step below its upper edge ("150–171 bpm", then "172 bpm and above"): no value reads as two zones.
 */
export function rangeText(measure: Measure, r: Range | undefined): string {
  if (!r) return "—";
  const unit = MEASURE_UNITS[measure];
  if (r.min === null && r.max !== null) return `below ${fmt(measure, r.max)} ${unit}`;
  if (r.max === null && r.min !== null) return `${fmt(measure, r.min)} ${unit} and above`;
  const top = Number(fmt(measure, r.max!)) - STEP[measure];
  return `${fmt(measure, r.min!)}–${fmt(measure, Math.max(Number(fmt(measure, r.min!)), top))} ${unit}`;
}

/** The same for pace (faster speed = shorter pace, so the bounds swap): a closed range stops a second short of the next
 * zone's pace. */
export function paceText(r: Range | undefined): string {
  if (!r) return "—";
  if (r.min === null && r.max !== null) return `slower than ${formatPace(paceSPerKm(r.max))}`;
  if (r.max === null && r.min !== null) return `${formatPace(paceSPerKm(r.min))} and faster`;
  return `${formatPace(paceSPerKm(r.max!) + 1)} – ${formatPace(paceSPerKm(r.min!))}`;
}

/** The measures a sport trains with, first to last (common practice): runners, walkers and skiers by pace, then heart
 * rate; cyclists and rowers by power, then heart rate; speed last on the bike. */
const MEASURE_ORDER: Record<string, Measure[]> = {
  running: ["speedKmh", "hrBpm", "powerW"],
  walking: ["speedKmh", "hrBpm", "powerW"],
  cross_country_skiing: ["speedKmh", "hrBpm", "powerW"],
  cycling: ["powerW", "hrBpm", "speedKmh"],
  rowing: ["powerW", "hrBpm", "speedKmh"],
};

/** The measures of a sport, the one it trains with first (heart rate, power, speed for sports not listed). */
export function measureOrder(sport: string): Measure[] {
  return MEASURE_ORDER[sport] ?? ["hrBpm", "powerW", "speedKmh"];
}

/** A step's target in the athlete's own numbers, the sport's own measure first: heart rate, power and, for speed sports,
 * pace. */
export function targetText(zone: Zone | undefined, sport: string): string | null {
  if (!zone) return null;
  const parts: string[] = [];
  for (const m of measureOrder(sport)) {
    const r = zone.ranges[m];
    if (!r) continue;
    parts.push(m === "speedKmh" && sport !== "cycling" ? paceText(r) : rangeText(m, r));
  }
  return parts.length ? parts.join(" · ") : null;
}
