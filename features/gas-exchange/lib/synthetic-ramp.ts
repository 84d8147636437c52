/**
 * Synthetic cycle-ergometer ramp tests with known thresholds: the test suite checks threshold detection against them, and
 * the demo uses them as its invented lab files.
 *
 * The model (documented so that the checks are reproducible):
 * - Protocol: `warmupS` at `warmupW`, then a ramp of `rampWPerMin` up to `peakW`, then `recoveryS` at 30 W.
 * - Steady-state VO2 from the ACSM leg-cycling equation in absolute units: VO2 = 7·mass + 1.8·6.12·W mL/min (ACSM's
 *   Guidelines for Exercise Testing and Prescription), reached with first-order kinetics (time constant `tauS`, 35 s default;
 *   common practice for moderate intensity, from memory).
 * - VCO2 against VO2 is two straight lines meeting at VT1 (slope 0.92 below, 1.40 above — the V-slope picture of Beaver,
 *   Wasserman & Whipp 1986; slopes chosen here, from memory of typical tests).
 * - VE against VCO2 is two straight lines meeting at the respiratory compensation point VT2 (VE/VCO2 slope 25 below and
 *   48 above; from memory of typical tests).
 * - Breath-to-breath noise: a tidal-volume factor shared by VO2, VCO2 and VE (SD `noise`, 7 % default) and 3 % independent
 *   noise each; 2 % aberrant breaths (swallows ×0.35, sighs ×1.9 on VE and ×1.6 on the gases).
 * Thresholds are set as fractions of the ramp's power range, so the true VT1 and VT2 VO2 are known exactly.
 */

export interface RampOptions {
  seed?: number;
  massKg?: number;
  warmupS?: number;
  warmupW?: number;
  rampWPerMin?: number;
  peakW?: number;
  vt1Fraction?: number;
  vt2Fraction?: number;
  tauS?: number;
  noise?: number;
  aberrantShare?: number;
  recoveryS?: number;
  hrRest?: number;
  hrMax?: number;
  /** Without thresholds: VCO2 and VE stay proportional (a hopeless file). */
  noBreakpoints?: boolean;
  /** Values in L/min instead of mL/min. */
  litres?: boolean;
  headers?: string[];
  delimiter?: string;
  decimalComma?: boolean;
}

export interface RampTruth {
  vt1Vo2MlMin: number;
  vt2Vo2MlMin: number;
  vt1PowerW: number;
  vt2PowerW: number;
  peakVo2MlMin: number;
  massKg: number;
}

export function mulberry32(seed: number) {
  return () => {
    seed |= 0;
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function gaussian(r: () => number): number {
  const u = Math.max(r(), 1e-12),
    v = r();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

export const CANONICAL_HEADERS = ["time_s", "vo2_ml_min", "vco2_ml_min", "ve_l_min", "hr_bpm", "power_w", "rf_per_min"];

export function syntheticRamp(o: RampOptions = {}): { csv: string; truth: RampTruth; rows: number[][] } {
  const r = mulberry32(o.seed ?? 1);
  const mass = o.massKg ?? 72;
  const warmupS = o.warmupS ?? 180;
  const warmupW = o.warmupW ?? 50;
  const rampPerS = (o.rampWPerMin ?? 25) / 60;
  const peakW = o.peakW ?? 350;
  const tau = o.tauS ?? 35;
  const noise = o.noise ?? 0.07;
  const aberrant = o.aberrantShare ?? 0.02;
  const recoveryS = o.recoveryS ?? 120;
  const hrRest = o.hrRest ?? 85;
  const hrMax = o.hrMax ?? 188;
  const vo2ss = (w: number) => 7 * mass + 1.8 * 6.12 * w;
  const p1 = warmupW + (o.vt1Fraction ?? 0.5) * (peakW - warmupW);
  const p2 = warmupW + (o.vt2Fraction ?? 0.8) * (peakW - warmupW);
  const vt1 = vo2ss(p1),
    vt2 = vo2ss(p2);
  const start = vo2ss(warmupW);
  const vco2Of = (vo2: number) => {
    const base = 0.85 * start + 0.92 * (vo2 - start);
    return o.noBreakpoints ? 0.85 * start + 0.97 * (vo2 - start) : base + (1.4 - 0.92) * Math.max(0, vo2 - vt1);
  };
  const vco2AtVt2 = vco2Of(vt2);
  const veOf = (vco2: number) =>
    o.noBreakpoints ? 3 + 0.027 * vco2 : 3 + 0.025 * vco2 + (0.048 - 0.025) * Math.max(0, vco2 - vco2AtVt2);
  const rampEndS = warmupS + (peakW - warmupW) / rampPerS;
  const totalS = rampEndS + recoveryS;
  const powerAt = (t: number) => (t < warmupS ? warmupW : t <= rampEndS ? warmupW + (t - warmupS) * rampPerS : 30);
  // 1 Hz noise-free VO2 with first-order kinetics.
  const vo2Series: number[] = [];
  let vo2 = start;
  for (let t = 0; t <= Math.ceil(totalS); t++) {
    vo2 += (vo2ss(powerAt(t)) - vo2) * (1 - Math.exp(-1 / tau));
    vo2Series.push(vo2);
  }
  let peak = 0;
  for (let t = 30; t < vo2Series.length; t++) {
    let s = 0;
    for (let k = t - 29; k <= t; k++) s += vo2Series[k]!;
    peak = Math.max(peak, s / 30);
  }
  const peakModel = Math.max(...vo2Series);
  const rows: number[][] = [];
  let t = 0;
  while (t < totalS) {
    const v = vo2Series[Math.min(vo2Series.length - 1, Math.round(t))]!;
    const frac = Math.max(0, Math.min(1, (v - start) / (peakModel - start)));
    const rf = 16 + 30 * frac * frac + gaussian(r);
    const common = 1 + noise * gaussian(r);
    let bVo2 = v * common * (1 + 0.03 * gaussian(r));
    let bVco2 = vco2Of(v) * common * (1 + 0.03 * gaussian(r));
    let bVe = veOf(vco2Of(v)) * common * (1 + 0.03 * gaussian(r));
    if (r() < aberrant) {
      const sigh = r() < 0.5;
      const g = sigh ? 1.6 : 0.35;
      bVo2 *= g;
      bVco2 *= g;
      bVe *= sigh ? 1.9 : 0.35;
    }
    const hr = hrRest + (hrMax - hrRest) * frac + 1.5 * gaussian(r);
    rows.push([t, bVo2, bVco2, bVe, hr, powerAt(t), rf]);
    t += (60 / Math.max(8, rf)) * (0.8 + 0.4 * r());
  }
  const headers = o.headers ?? CANONICAL_HEADERS;
  const delim = o.delimiter ?? ",";
  const fmt = (x: number, digits: number) => {
    const s = x.toFixed(digits);
    return o.decimalComma ? s.replace(".", ",") : s;
  };
  const lines = [headers.join(delim)];
  for (const row of rows) {
    const [tt, a, b, c, hr, w, rf] = row as [number, number, number, number, number, number, number];
    const gas = (x: number) => (o.litres ? fmt(x / 1000, 3) : fmt(x, 0));
    lines.push([fmt(tt, 1), gas(a), gas(b), fmt(c, 1), fmt(hr, 0), fmt(w, 0), fmt(rf, 0)].join(delim));
  }
  return {
    csv: lines.join("\n") + "\n",
    truth: { vt1Vo2MlMin: vt1, vt2Vo2MlMin: vt2, vt1PowerW: p1, vt2PowerW: p2, peakVo2MlMin: peak, massKg: mass },
    rows,
  };
}
