import { clock, paceSeconds, speedIn, speedStyle, type SpeedStyle, type Units } from "@/features/platform/lib/units";
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
  if (r.min === null && r.max !== null && r.shownFrom !== undefined)
    return rangeText(measure, { min: r.shownFrom, max: r.max });
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

/**
 * A speed range in a sport's style (platform/lib/units.ts): speeds as "10.0–11.9 mph" (one shown step below the next
 * zone's edge, as rangeText); paces and splits with the bounds swapped, a closed range a second short of the next zone's
 * ("5:01 /km – 6:00 /km", "slower than 2:10 /500 m", "1:40 /100 m and faster").
 */
export function speedRangeText(r: Range | undefined, style: SpeedStyle): string {
  if (!r) return "—";
  if (style.kind === "speed") {
    const f = (v: number) => speedIn(v, style).toFixed(1);
    if (r.min === null && r.max !== null) return `below ${f(r.max)} ${style.unit}`;
    if (r.max === null && r.min !== null) return `${f(r.min)} ${style.unit} and above`;
    const top = Math.max(Number(f(r.min!)), Number(f(r.max!)) - 0.1);
    return `${f(r.min!)}–${top.toFixed(1)} ${style.unit}`;
  }
  const p = (v: number) => `${clock(paceSeconds(v, style))} ${style.unit}`;
  if (r.min === null && r.max !== null) return `slower than ${p(r.max)}`;
  if (r.max === null && r.min !== null) return `${p(r.min)} and faster`;
  return `${clock(paceSeconds(r.max!, style) + 1)} ${style.unit} – ${p(r.min!)}`;
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
export function targetText(zone: Zone | undefined, sport: string, units: Units = "metric"): string | null {
  if (!zone) return null;
  const parts: string[] = [];
  for (const m of measureOrder(sport)) {
    const r = zone.ranges[m];
    if (!r) continue;
    parts.push(m === "speedKmh" ? speedRangeText(r, speedStyle(sport, units)) : rangeText(m, r));
  }
  return parts.length ? parts.join(" · ") : null;
}
