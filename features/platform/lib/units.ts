/**
 * A person's units (metric or imperial) and each sport's way of saying how fast: pace per kilometre or mile for running,
 * walking, skiing and triathlon; speed in km/h or mph for cycling; the split per 500 m for rowing (the trade's unit in
 * either system); pace per 100 m or per 100 yards for swimming. Values are stored in SI-derived units (km/h, metres) and
 * only shown this way. Conversion factors: the international mile is 1609.344 m and the yard 0.9144 m (exact by
 * definition; NIST Handbook 44, Appendix C).
 */

export const UNIT_SYSTEMS = ["metric", "imperial"] as const;
export type Units = (typeof UNIT_SYSTEMS)[number];
export const UNIT_LABELS: Record<Units, string> = {
  metric: "Metric (km, km/h, min/km)",
  imperial: "Imperial (mi, mph, min/mi)",
};

export const METRES_PER_MILE = 1609.344;
export const METRES_PER_YARD = 0.9144;

/** How a sport's speed is shown: a time per distance ("pace") or a distance per hour ("speed"). */
export interface SpeedStyle {
  kind: "pace" | "speed";
  /** For a pace: the distance the time is for, in metres; for a speed: metres per unit of the hourly figure. */
  metres: number;
  /** What follows the number: "/km", "/mi", "/500 m", "/100 m", "/100 yd", "km/h", "mph". */
  unit: string;
  /** The column heading of a zone table. */
  label: string;
}

const PACE_KM: SpeedStyle = { kind: "pace", metres: 1000, unit: "/km", label: "Pace" };
const PACE_MI: SpeedStyle = { kind: "pace", metres: METRES_PER_MILE, unit: "/mi", label: "Pace" };
const KMH: SpeedStyle = { kind: "speed", metres: 1000, unit: "km/h", label: "Speed" };
const MPH: SpeedStyle = { kind: "speed", metres: METRES_PER_MILE, unit: "mph", label: "Speed" };
const SPLIT_500: SpeedStyle = { kind: "pace", metres: 500, unit: "/500 m", label: "Split" };
const SWIM_100M: SpeedStyle = { kind: "pace", metres: 100, unit: "/100 m", label: "Pace" };
const SWIM_100YD: SpeedStyle = { kind: "pace", metres: 100 * METRES_PER_YARD, unit: "/100 yd", label: "Pace" };

export function speedStyle(sport: string, units: Units = "metric"): SpeedStyle {
  const imperial = units === "imperial";
  switch (sport) {
    case "running":
    case "walking":
    case "cross_country_skiing":
    case "triathlon":
      return imperial ? PACE_MI : PACE_KM;
    case "rowing":
      return SPLIT_500;
    case "swimming":
      return imperial ? SWIM_100YD : SWIM_100M;
    default:
      return imperial ? MPH : KMH;
  }
}

/** The plain speed style of a unit system (km/h or mph), for a second column beside a pace. */
export function plainSpeed(units: Units = "metric"): SpeedStyle {
  return units === "imperial" ? MPH : KMH;
}

/** Seconds for the style's distance at a speed in km/h. */
export function paceSeconds(speedKmh: number, style: SpeedStyle): number {
  return (style.metres / 1000) * (3600 / speedKmh);
}

/** The hourly figure of a speed in km/h in the style's unit (km/h or mph). */
export function speedIn(speedKmh: number, style: SpeedStyle): number {
  return (speedKmh * 1000) / style.metres;
}

export function clock(seconds: number): string {
  const total = Math.round(seconds);
  const h = Math.floor(total / 3600),
    m = Math.floor((total % 3600) / 60),
    s = total % 60;
  return h ? `${h}:${String(m).padStart(2, "0")}:${String(s).padStart(2, "0")}` : `${m}:${String(s).padStart(2, "0")}`;
}

/** One speed as the style says it: "4:37 /km", "13.0 km/h", "2:18 /500 m". */
export function speedText(speedKmh: number, style: SpeedStyle): string {
  return style.kind === "pace"
    ? `${clock(paceSeconds(speedKmh, style))} ${style.unit}`
    : `${speedIn(speedKmh, style).toFixed(1)} ${style.unit}`;
}

/**
 * A distance in the person's units: metric in metres below 1 km ("800 m") and km above ("5 km", "21.1 km"); imperial in
 * yards below a quarter mile ("437 yd") and miles above ("3.1 mi"). Swimmers count pool lengths in metres or yards, so a
 * swim stays in metres or yards at every length.
 */
export function distanceText(metres: number, units: Units = "metric", sport?: string): string {
  const trim = (v: number) => (Number.isInteger(v) ? String(v) : v.toFixed(1));
  if (units === "imperial") {
    const yards = metres / METRES_PER_YARD;
    if (sport === "swimming" || metres < METRES_PER_MILE / 4) return `${Math.round(yards)} yd`;
    return `${trim(Math.round((metres / METRES_PER_MILE) * 10) / 10)} mi`;
  }
  if (sport === "swimming" || metres < 1000) return `${Math.round(metres)} m`;
  return `${trim(Math.round(metres / 100) / 10)} km`;
}

/** A distance in km or mi as a number (exports), rounded to two decimals. */
export function distanceIn(km: number, units: Units = "metric"): number {
  return Math.round((units === "imperial" ? (km * 1000) / METRES_PER_MILE : km) * 100) / 100;
}

/** A distance typed in km or mi, in km (stored); null stays null. */
export function toKm(value: number | null, units: Units = "metric"): number | null {
  if (value === null || !Number.isFinite(value)) return value;
  return units === "imperial" ? Math.round(((value * METRES_PER_MILE) / 1000) * 1000) / 1000 : value;
}
