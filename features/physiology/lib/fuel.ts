/**
 * Fuel use from gas exchange (protein neglected). Gas volumes in L/min.
 * Weir 1949 (abbreviated) energy expenditure; Frayn 1983 and Jeukendrup & Wallis 2005 oxidation rates; the non-protein RQ
 * table after Lusk 1924 (values from memory, ±2 points).
 */

export function weirKcalMin(vo2LMin: number, vco2LMin: number): number {
  return 3.941 * vo2LMin + 1.106 * vco2LMin;
}

export interface Oxidation {
  choGMin: number;
  fatGMin: number;
}

export type OxidationEquation = "frayn" | "jeukendrup-wallis";

/** Frayn 1983: CHO = 4.55·VCO2 − 3.21·VO2; fat = 1.67·(VO2 − VCO2). */
export function fraynOxidation(vo2LMin: number, vco2LMin: number): Oxidation {
  return { choGMin: 4.55 * vco2LMin - 3.21 * vo2LMin, fatGMin: 1.67 * (vo2LMin - vco2LMin) };
}

/** Jeukendrup & Wallis 2005 (moderate to high intensity, 50–75 % VO2max): CHO = 4.210·VCO2 − 2.962·VO2; fat = 1.695·VO2 − 1.701·VCO2. */
export function jeukendrupWallisOxidation(vo2LMin: number, vco2LMin: number): Oxidation {
  return { choGMin: 4.21 * vco2LMin - 2.962 * vo2LMin, fatGMin: 1.695 * vo2LMin - 1.701 * vco2LMin };
}

export function oxidation(vo2LMin: number, vco2LMin: number, equation: OxidationEquation = "frayn"): Oxidation {
  return equation === "frayn" ? fraynOxidation(vo2LMin, vco2LMin) : jeukendrupWallisOxidation(vo2LMin, vco2LMin);
}

// Non-protein RQ → share of energy from carbohydrate, % (after Lusk 1924; from memory).
const NPRQ_TABLE: [number, number][] = [
  [0.707, 0],
  [0.71, 1.1],
  [0.72, 4.8],
  [0.73, 8.4],
  [0.74, 12.0],
  [0.75, 15.6],
  [0.76, 19.2],
  [0.77, 22.8],
  [0.78, 26.3],
  [0.79, 29.9],
  [0.8, 33.4],
  [0.81, 36.9],
  [0.82, 40.3],
  [0.83, 43.8],
  [0.84, 47.2],
  [0.85, 50.7],
  [0.86, 54.1],
  [0.87, 57.5],
  [0.88, 60.8],
  [0.89, 64.2],
  [0.9, 67.5],
  [0.91, 70.8],
  [0.92, 74.1],
  [0.93, 77.4],
  [0.94, 80.7],
  [0.95, 84.0],
  [0.96, 87.2],
  [0.97, 90.4],
  [0.98, 93.6],
  [0.99, 96.8],
  [1.0, 100],
];

/** Share of energy from carbohydrate (0–1) at a non-protein RQ; clamped to 0 below 0.707 and 1 above 1.00. */
export function carbohydrateShare(rq: number): number {
  if (!Number.isFinite(rq)) return NaN;
  if (rq <= NPRQ_TABLE[0]![0]) return 0;
  if (rq >= 1) return 1;
  for (let i = 1; i < NPRQ_TABLE.length; i++) {
    const [r1, p1] = NPRQ_TABLE[i]!;
    if (rq <= r1) {
      const [r0, p0] = NPRQ_TABLE[i - 1]!;
      return (p0 + ((rq - r0) / (r1 - r0)) * (p1 - p0)) / 100;
    }
  }
  return 1;
}

export interface FuelPoint {
  vo2MlMin: number;
  vco2MlMin: number;
  timeS?: number;
  powerW?: number | null;
  speedKmh?: number | null;
  hrBpm?: number | null;
}

export interface FuelRow extends FuelPoint {
  rer: number;
  kcalMin: number;
  choGMin: number;
  fatGMin: number;
  choShare: number;
  fatShare: number;
}

export interface FuelProfile {
  rows: FuelRow[];
  /** First point from which carbohydrate supplies more energy than fat (RER ≈ 0.85), or null. */
  crossover: FuelRow | null;
  /** The point of maximal fat oxidation (smoothed over three points), or null when no fat is oxidised. */
  maxFat: (FuelRow & { vo2PctPeak: number | null }) | null;
  warnings: string[];
}

export function fuelProfile(
  points: FuelPoint[],
  opts: { equation?: OxidationEquation; vo2PeakMlMin?: number } = {},
): FuelProfile {
  const warnings: string[] = [];
  const rows: FuelRow[] = points.map((p) => {
    const vo2 = p.vo2MlMin / 1000,
      vco2 = p.vco2MlMin / 1000;
    const rer = vco2 / vo2;
    const ox = oxidation(vo2, vco2, opts.equation);
    const choShare = carbohydrateShare(rer);
    return {
      ...p,
      rer,
      kcalMin: weirKcalMin(vo2, vco2),
      // Negative rates mean the equations left their valid range (RER outside 0.7–1.0): shown as zero.
      choGMin: Math.max(0, ox.choGMin),
      fatGMin: Math.max(0, ox.fatGMin),
      choShare,
      fatShare: 1 - choShare,
    };
  });
  if (rows.some((r) => r.rer > 1))
    warnings.push(
      "Above RER 1.00 the equations no longer hold (bicarbonate buffering adds CO2): fat oxidation is shown as zero there.",
    );
  if (rows.some((r) => r.rer < 0.7))
    warnings.push("RER below 0.70 is outside the equations' range (hyperventilation, fasting or measurement error).");
  let crossover: FuelRow | null = null;
  for (let i = 0; i < rows.length; i++) {
    // Sustained: this and the next two points (when present) all above half.
    if (rows.slice(i, i + 3).every((r) => r.choShare > 0.5)) {
      crossover = rows[i]!;
      break;
    }
  }
  let maxFat: FuelProfile["maxFat"] = null;
  let best = 0;
  for (let i = 0; i < rows.length; i++) {
    const win = rows.slice(Math.max(0, i - 1), i + 2);
    const smooth = win.reduce((s, r) => s + r.fatGMin, 0) / win.length;
    if (smooth > best) {
      best = smooth;
      maxFat = {
        ...rows[i]!,
        fatGMin: smooth,
        vo2PctPeak: opts.vo2PeakMlMin ? (100 * rows[i]!.vo2MlMin) / opts.vo2PeakMlMin : null,
      };
    }
  }
  return { rows, crossover, maxFat, warnings };
}
