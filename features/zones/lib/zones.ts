/**
 * Zones from the two ventilatory thresholds: the three-zone model (below VT1, VT1–VT2, above VT2; Seiler & Kjerland 2006)
 * and an optional five-zone subdivision of our own (common practice: an easy split of zone 1 and a split of zone 2 at its
 * midpoint). Each zone is given in every measure the thresholds carry: heart rate, power and speed/pace, with an RPE band.
 */

export type Measure = "hrBpm" | "powerW" | "speedKmh";
export const MEASURES: Measure[] = ["hrBpm", "powerW", "speedKmh"];

export interface ThresholdPoint {
  hrBpm?: number | null;
  powerW?: number | null;
  speedKmh?: number | null;
}

export interface Range {
  /** Inclusive lower bound; null = open. */
  min: number | null;
  /** Exclusive upper bound; null = open. */
  max: number | null;
  /**
   * Shown only: where an open lower end is said to start (zone 1's heart rate from the light-intensity floor, see
   * `withShownFloor`). Effort below it still counts as zone 1 (`zoneOf` ignores it).
   */
  shownFrom?: number;
}

export interface Zone {
  zone: number;
  /** The three-zone parent (1–3). */
  parent: 1 | 2 | 3;
  name: string;
  ranges: Partial<Record<Measure, Range>>;
  /**
   * Perceived exertion band on the CR-10 scale with the verbal anchors of Foster et al. 2001 (J Strength Cond Res
   * 15:109–115, after Borg): 1 very, very easy · 2 easy · 3 moderate · 4 somewhat hard · 5 hard · 7 very hard · 10
   * maximal (the scale of the logs, features/logs/lib/cr10.ts). Zone 1 spans "very, very easy" to "moderate", zone 2 "somewhat hard" to "hard", zone 3
   * "very hard" up; placing the anchors in the three zones is common practice.
   */
  rpe: [number, number];
}

const THREE: { name: string; rpe: [number, number] }[] = [
  { name: "Zone 1 · low", rpe: [1, 3] },
  { name: "Zone 2 · moderate", rpe: [4, 6] },
  { name: "Zone 3 · high", rpe: [7, 10] },
];

function presentMeasures(vt1: ThresholdPoint, vt2: ThresholdPoint): Measure[] {
  return MEASURES.filter((m) => vt1[m] != null && vt2[m] != null);
}

export class ZoneError extends Error {}

export function threeZones(vt1: ThresholdPoint, vt2: ThresholdPoint): Zone[] {
  const measures = presentMeasures(vt1, vt2);
  if (!measures.length)
    throw new ZoneError("Both thresholds need at least one shared measure (heart rate, power or speed).");
  for (const m of measures) {
    if (!(vt1[m]! < vt2[m]!)) throw new ZoneError(`VT1 must lie below VT2 (${m}: ${vt1[m]} vs ${vt2[m]}).`);
  }
  return THREE.map((z, i) => ({
    zone: i + 1,
    parent: (i + 1) as 1 | 2 | 3,
    name: z.name,
    rpe: z.rpe,
    ranges: Object.fromEntries(
      measures.map((m) => [
        m,
        i === 0 ? { min: null, max: vt1[m]! } : i === 1 ? { min: vt1[m]!, max: vt2[m]! } : { min: vt2[m]!, max: null },
      ]),
    ),
  }));
}

/**
 * Five zones: 1 below 85 % of VT1, 2 up to VT1, 3 VT1 to the VT1–VT2 midpoint, 4 up to VT2, 5 above VT2. The split of zone
 * 1 is placed in ONE domain, the workload (power, else speed; heart rate only when it is the only measure), and carried
 * to the other measures along the line through the two thresholds, so that the edge is the same effort in every measure.
 * (85 % of VT1 applied to heart rate itself, which starts from a resting value, would put the heart-rate edge at an
 * easier effort than the power edge.) Heart rate is close to linear in workload between the thresholds; below VT1 the
 * line is extrapolated a little (common practice).
 */
export function fiveZones(vt1: ThresholdPoint, vt2: ThresholdPoint): Zone[] {
  const three = threeZones(vt1, vt2);
  const measures = Object.keys(three[0]!.ranges) as Measure[];
  const cut = (f: (m: Measure) => [number | null, number | null]) =>
    Object.fromEntries(measures.map((m) => [m, { min: f(m)[0], max: f(m)[1] }]));
  const mid = (m: Measure) => (vt1[m]! + vt2[m]!) / 2;
  const ref: Measure = measures.includes("powerW") ? "powerW" : measures.includes("speedKmh") ? "speedKmh" : "hrBpm";
  const easyEdgeRef = 0.85 * vt1[ref]!;
  // Where the reference edge lies between VT1 (0) and VT2 (1): negative, below VT1.
  const at = (easyEdgeRef - vt1[ref]!) / (vt2[ref]! - vt1[ref]!);
  const easyEdge = (m: Measure) => (m === ref ? easyEdgeRef : vt1[m]! + at * (vt2[m]! - vt1[m]!));
  return [
    { zone: 1, parent: 1, name: "Zone 1 · recovery", rpe: [1, 2], ranges: cut((m) => [null, easyEdge(m)]) },
    { zone: 2, parent: 1, name: "Zone 2 · endurance", rpe: [2, 3], ranges: cut((m) => [easyEdge(m), vt1[m]!]) },
    { zone: 3, parent: 2, name: "Zone 3 · tempo", rpe: [4, 5], ranges: cut((m) => [vt1[m]!, mid(m)]) },
    { zone: 4, parent: 2, name: "Zone 4 · threshold", rpe: [5, 6], ranges: cut((m) => [mid(m), vt2[m]!]) },
    { zone: 5, parent: 3, name: "Zone 5 · high", rpe: [7, 10], ranges: cut((m) => [vt2[m]!, null]) },
  ];
}

/** The zone a value falls in for a measure (bounds: lower inclusive, upper exclusive), or null when not covered. */
export function zoneOf(value: number, zones: Zone[], measure: Measure): number | null {
  for (const z of zones) {
    const r = z.ranges[measure];
    if (!r) return null;
    if ((r.min === null || value >= r.min) && (r.max === null || value < r.max)) return z.zone;
  }
  return null;
}

/** Pace in seconds per km from a speed in km/h. */
export function paceSPerKm(speedKmh: number): number {
  return 3600 / speedKmh;
}

export function formatPace(secondsPerKm: number): string {
  const total = Math.round(secondsPerKm);
  return `${Math.floor(total / 60)}:${String(total % 60).padStart(2, "0")} /km`;
}

/** The zone set in force on a date ("YYYY-MM-DD"): the latest one effective on or before it. */
export function zoneSetInForce<T extends { effectiveFrom: string }>(sets: T[], date: string): T | null {
  let best: T | null = null;
  for (const s of sets) if (s.effectiveFrom <= date && (!best || s.effectiveFrom > best.effectiveFrom)) best = s;
  return best;
}

/**
 * Sports in order of how near their heart-rate response to effort is to each sport's (common practice: similar muscle
 * mass and posture respond alike; swimming, with the body level in water, runs lowest). Our own order. It is only the
 * fallback for a session of a sport the athlete has no zones for yet.
 */
const NEAREST_SPORTS: Record<string, string[]> = {
  running: ["cross_country_skiing", "walking", "triathlon", "rowing", "cycling", "swimming"],
  walking: ["running", "cross_country_skiing", "triathlon", "cycling", "rowing", "swimming"],
  cross_country_skiing: ["running", "rowing", "walking", "triathlon", "cycling", "swimming"],
  cycling: ["triathlon", "rowing", "running", "cross_country_skiing", "walking", "swimming"],
  triathlon: ["running", "cycling", "cross_country_skiing", "rowing", "walking", "swimming"],
  rowing: ["cross_country_skiing", "cycling", "running", "triathlon", "walking", "swimming"],
  swimming: ["triathlon", "rowing", "cross_country_skiing", "running", "cycling", "walking"],
};

/**
 * The zones for a session: the set in force for its sport on its day; without one, the nearest sport's set in force
 * (NEAREST_SPORTS), with heart rate only (power and pace do not carry from one sport to another) and `fromSport` naming
 * where it comes from; null when the athlete has no zones in force at all.
 */
export function zonesForSession<T extends { sport: string; effectiveFrom: string; zones: Zone[] }>(
  sets: T[],
  sport: string,
  date: string,
): { set: T; fromSport: string | null } | null {
  const own = zoneSetInForce(
    sets.filter((z) => z.sport === sport),
    date,
  );
  if (own) return { set: own, fromSport: null };
  const order = NEAREST_SPORTS[sport] ?? [];
  const others = [...new Set(sets.map((z) => z.sport))].sort(
    (a, b) => (order.indexOf(a) + 1 || 99) - (order.indexOf(b) + 1 || 99),
  );
  for (const other of others) {
    const set = zoneSetInForce(
      sets.filter((z) => z.sport === other),
      date,
    );
    if (!set) continue;
    const zones = set.zones.filter((z) => z.ranges.hrBpm).map((z) => ({ ...z, ranges: { hrBpm: z.ranges.hrBpm } }));
    if (zones.length) return { set: { ...set, zones }, fromSport: other };
  }
  return null;
}

/**
 * The share of maximal heart rate where light-intensity exercise begins: below it the ACSM position stand calls
 * exercise "very light" (Garber et al. 2011, Med Sci Sports Exerc 43:1334–1359, table of intensity classes: very light
 * < 57 % HRmax, light 57–63 %; the figures from memory of that table).
 */
export const LIGHT_FLOOR_OF_HRMAX = 0.57;

/**
 * Zones as shown to a person: zone 1's open heart-rate range gets a lower end at the light-intensity floor of the
 * athlete's maximal heart rate ("107–149 bpm" instead of "below 150 bpm"), when the maximum is known and the floor lies
 * below VT1. Nothing else changes: the zones a session or a file is scored against stay as they are.
 */
export function withShownFloor<Z extends Zone>(zones: Z[], maxHrBpm: number | null | undefined): Z[] {
  if (!maxHrBpm) return zones;
  const floor = Math.round(LIGHT_FLOOR_OF_HRMAX * maxHrBpm);
  return zones.map((z) => {
    const hr = z.ranges.hrBpm;
    if (z.parent !== 1 || !hr || hr.min !== null || hr.max === null || floor >= hr.max) return z;
    return { ...z, ranges: { ...z.ranges, hrBpm: { ...hr, shownFrom: floor } } };
  });
}
