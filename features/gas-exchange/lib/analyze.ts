/**
 * Ventilatory thresholds from a ramp or step test.
 *
 * VT1: V-slope — VCO2 against VO2 below the respiratory compensation point, continuous two-segment regression, VT1 where the
 *      slope rises above 1 (Beaver, Wasserman & Whipp 1986, J Appl Physiol 60:2020–2027); cross-checked with the
 *      ventilatory-equivalents rule: VE/VO2 starts to rise while VE/VCO2 does not (Wasserman et al., Principles of Exercise
 *      Testing and Interpretation).
 * VT2: the respiratory compensation point — breakpoint of VE against VCO2, cross-checked with the rise of VE/VCO2.
 * A threshold that cannot be found is null with a reason, never a made-up number.
 */
import { fitHinge, type HingeFit } from "./breakpoint";
import { average, DEFAULT_AVERAGING, highestWindowMean, removeAberrantBreaths, type Averaging, type CleanOptions } from "./clean";
import { readGasExchangeCsv, type Breath, type ColumnMapping, type DetectedColumn, type Channel } from "./csv";

export type MethodName = "v-slope" | "ventilatory-equivalents" | "ve-vco2-slope" | "ve-vco2-ratio";

export interface MethodResult {
  method: MethodName;
  found: boolean;
  vo2MlMin: number | null;
  timeS: number | null;
  note: string;
}

export interface Threshold {
  vo2MlMin: number;
  vo2MlKgMin: number | null;
  vco2MlMin: number;
  hrBpm: number | null;
  powerW: number | null;
  speedKmh: number | null;
  timeS: number;
  /** Methods that found this threshold (the first is the one whose value is reported). */
  methods: MethodName[];
  methodResults: MethodResult[];
  /** How far the cross-check lies from the reported value, when it found one. */
  agreement: { differenceMlMin: number; differencePct: number } | null;
  confidence: number;
  warnings: string[];
}

export interface Peak {
  vo2MlMin: number;
  vo2MlKgMin: number | null;
  hrBpm: number | null;
  rer: number | null;
  powerW: number | null;
  speedKmh: number | null;
  plateau: boolean;
}

export interface Analysis {
  vt1: Threshold | null;
  vt1Reason: string | null;
  vt2: Threshold | null;
  vt2Reason: string | null;
  peak: Peak;
  warnings: string[];
  /** The averaged points the thresholds were searched in (for charts). */
  points: Breath[];
  onsetS: number;
  endS: number;
  breathsRead: number;
  breathsRemoved: number;
  columns: Partial<Record<Channel, DetectedColumn>>;
}

export interface AnalysisOptions {
  mapping?: ColumnMapping;
  bodyMassKg?: number | null;
  averaging?: Averaging;
  cleaning?: CleanOptions;
}

export type CsvAnalysis = ({ ok: true } & Analysis) | { ok: false; error: string; headers: string[] };

const MIN_POINTS = 20;
const KINETICS_LAG_S = 60;

const round = (v: number, digits = 0) => {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
};
const clamp01 = (v: number) => Math.max(0, Math.min(1, v));

function workload(b: Breath): number | null {
  return b.powerW ?? b.speedKmh;
}

/** Mean of a field over points within ±halfS of t, or null. */
function localMean(points: Breath[], t: number, halfS: number, f: (b: Breath) => number | null): number | null {
  let s = 0, c = 0;
  for (const p of points) {
    if (Math.abs(p.timeS - t) <= halfS) {
      const v = f(p);
      if (v !== null && Number.isFinite(v)) {
        s += v;
        c++;
      }
    }
  }
  return c ? s / c : null;
}

function nearest(points: Breath[], t: number): Breath {
  return points.reduce((best, p) => (Math.abs(p.timeS - t) < Math.abs(best.timeS - t) ? p : best), points[0]!);
}

/** The time at which a rising signal reaches `value`: median time of the points within 3 % of it. */
function timeAtValue(points: Breath[], value: number, f: (b: Breath) => number): number {
  let near = points.filter((p) => Math.abs(f(p) - value) <= 0.03 * value).map((p) => p.timeS);
  if (near.length === 0) {
    const closest = points.reduce((best, p) => (Math.abs(f(p) - value) < Math.abs(f(best) - value) ? p : best), points[0]!);
    near = [closest.timeS];
  }
  near.sort((a, b) => a - b);
  return near[near.length >> 1]!;
}

function findSegment(points: Breath[], peakEndS: number): { onsetS: number; endS: number } {
  const hasLoad = points.filter((p) => workload(p) !== null).length > points.length * 0.5;
  let endS = peakEndS;
  let onsetS = points[0]!.timeS;
  if (hasLoad) {
    const loads = points.map((p) => workload(p) ?? -Infinity);
    const maxLoad = Math.max(...loads);
    // The end of exercise: the last point still at (nearly) the highest workload.
    let lastAtMax = 0;
    loads.forEach((l, i) => {
      if (l >= 0.97 * maxLoad) lastAtMax = i;
    });
    endS = Math.max(points[lastAtMax]!.timeS, Math.min(peakEndS, points[lastAtMax]!.timeS + 30));
    const early = loads.slice(0, Math.max(3, Math.floor(points.length * 0.1))).filter(Number.isFinite).sort((a, b) => a - b);
    const baseline = early[early.length >> 1] ?? 0;
    const rise = baseline + Math.max(5, 0.05 * (maxLoad - baseline));
    const first = loads.findIndex((l) => l > rise);
    if (first > 0) onsetS = points[first - 1]!.timeS;
  }
  return { onsetS, endS };
}

function confidenceOf(fit: HingeFit, slopeRatio: number, agreementPct: number | null): number {
  const fitScore = clamp01(fit.gain / 0.4);
  const slopeScore = clamp01((slopeRatio - 1) / 0.3);
  const agreementScore = agreementPct === null ? 0 : clamp01(1 - agreementPct / 10);
  return round(0.35 * fitScore + 0.25 * slopeScore + 0.4 * agreementScore, 2);
}

/** The numbers at a moment of the test (means over ±15 s): used for detected thresholds and while a coach drags a marker. */
export function valuesAt(points: Breath[], t: number, bodyMassKg?: number | null) {
  return describeAt(points, t, bodyMassKg);
}

function describeAt(points: Breath[], t: number, bodyMassKg: number | null | undefined) {
  const vo2 = localMean(points, t, 15, (p) => p.vo2MlMin) ?? nearest(points, t).vo2MlMin;
  return {
    vo2MlMin: round(vo2),
    vo2MlKgMin: bodyMassKg ? round(vo2 / bodyMassKg, 1) : null,
    vco2MlMin: round(localMean(points, t, 15, (p) => p.vco2MlMin) ?? nearest(points, t).vco2MlMin),
    hrBpm: ((v) => (v === null ? null : round(v)))(localMean(points, t, 15, (p) => p.hrBpm)),
    powerW: ((v) => (v === null ? null : round(v)))(localMean(points, t, 15, (p) => p.powerW)),
    speedKmh: ((v) => (v === null ? null : round(v, 1)))(localMean(points, t, 15, (p) => p.speedKmh)),
    timeS: round(t),
  };
}

/** VT2: breakpoint of VE against VCO2 (slope must rise), cross-checked with the rise of VE/VCO2 over time. */
function detectVt2(points: Breath[], bodyMassKg?: number | null): { vt2: Threshold | null; reason: string | null } {
  const xs = points.map((p) => p.vco2MlMin);
  const ys = points.map((p) => p.veLMin);
  const lo = Math.min(...xs), hi = Math.max(...xs);
  const fit = fitHinge(xs, ys, { minSegment: 4, range: [lo + 0.4 * (hi - lo), lo + 0.97 * (hi - lo)] });
  if (!fit) return { vt2: null, reason: "VT2 not found: too few points above the lower part of the test." };
  const ratio = fit.slopeBefore > 0 ? fit.slopeAfter / fit.slopeBefore : 0;
  if (ratio < 1.15 || fit.gain < 0.1) {
    return { vt2: null, reason: "VT2 not found: VE rises in proportion to VCO2 to the end (no respiratory compensation point; the test may have stopped before it)." };
  }
  const t = timeAtValue(points, fit.x0, (p) => p.vco2MlMin);
  const at = describeAt(points, t, bodyMassKg);
  // Cross-check: VE/VCO2 over time, breakpoint where it starts to rise.
  const upper = points.filter((p) => p.timeS >= points[0]!.timeS + 0.3 * (points[points.length - 1]!.timeS - points[0]!.timeS));
  const eq = fitHinge(upper.map((p) => p.timeS), upper.map((p) => p.veLMin / p.vco2MlMin * 1000), { minSegment: 4 });
  const results: MethodResult[] = [
    { method: "ve-vco2-slope", found: true, vo2MlMin: at.vo2MlMin, timeS: at.timeS, note: `VE/VCO2 slope ${round(fit.slopeBefore * 1000, 1)} → ${round(fit.slopeAfter * 1000, 1)}` },
  ];
  let agreement: Threshold["agreement"] = null;
  const warnings: string[] = [];
  if (eq && eq.slopeAfter > 0 && eq.slopeAfter > eq.slopeBefore + 1e-4) {
    const eqVo2 = round(localMean(points, eq.x0, 15, (p) => p.vo2MlMin)!);
    results.push({ method: "ve-vco2-ratio", found: true, vo2MlMin: eqVo2, timeS: round(eq.x0), note: "VE/VCO2 starts to rise" });
    const diff = Math.abs(eqVo2 - at.vo2MlMin);
    agreement = { differenceMlMin: round(diff), differencePct: round((100 * diff) / at.vo2MlMin, 1) };
    if (agreement.differencePct > 10) warnings.push(`The two VT2 methods differ by ${agreement.differenceMlMin} mL/min (${agreement.differencePct} %); check the curves.`);
  } else {
    results.push({ method: "ve-vco2-ratio", found: false, vo2MlMin: null, timeS: null, note: "no clear rise of VE/VCO2" });
    warnings.push("VE/VCO2 shows no clear rise; VT2 rests on the VE–VCO2 slope alone.");
  }
  const confidence = confidenceOf(fit, ratio, agreement?.differencePct ?? null);
  return {
    vt2: {
      ...at,
      methods: results.filter((r) => r.found).map((r) => r.method),
      methodResults: results,
      agreement,
      confidence,
      warnings,
    },
    reason: null,
  };
}

/** VT1: V-slope below VT2, cross-checked with the ventilatory equivalents. */
function detectVt1(points: Breath[], vt2: Threshold | null, bodyMassKg?: number | null): { vt1: Threshold | null; reason: string | null } {
  const below = vt2 ? points.filter((p) => p.timeS < vt2.timeS) : points;
  if (below.length < MIN_POINTS / 2) return { vt1: null, reason: "VT1 not found: too few points below the respiratory compensation point." };
  const xs = below.map((p) => p.vo2MlMin);
  const ys = below.map((p) => p.vco2MlMin);
  const lo = Math.min(...xs), hi = Math.max(...xs);
  const fit = fitHinge(xs, ys, { minSegment: 4, range: [lo + 0.1 * (hi - lo), lo + 0.9 * (hi - lo)] });
  if (!fit) return { vt1: null, reason: "VT1 not found: too few points for the V-slope method." };
  const ratio = fit.slopeBefore > 0 ? fit.slopeAfter / fit.slopeBefore : 0;
  if (fit.slopeAfter <= 1 || fit.slopeAfter - fit.slopeBefore < 0.1 || fit.gain < 0.1) {
    return { vt1: null, reason: "VT1 not found: VCO2 rises in proportion to VO2 throughout (no clear V-slope breakpoint)." };
  }
  const t = timeAtValue(below, fit.x0, (p) => p.vo2MlMin);
  const at = describeAt(points, t, bodyMassKg);
  at.vo2MlMin = round(fit.x0);
  at.vo2MlKgMin = bodyMassKg ? round(fit.x0 / bodyMassKg, 1) : null;
  const results: MethodResult[] = [
    { method: "v-slope", found: true, vo2MlMin: at.vo2MlMin, timeS: at.timeS, note: `VCO2/VO2 slope ${round(fit.slopeBefore, 2)} → ${round(fit.slopeAfter, 2)}` },
  ];
  const warnings: string[] = [];
  let agreement: Threshold["agreement"] = null;
  // Ventilatory equivalents: VE/VO2 breakpoint over time, with VE/VCO2 not rising after it.
  const eqO2 = fitHinge(below.map((p) => p.timeS), below.map((p) => (p.veLMin / p.vo2MlMin) * 1000), { minSegment: 4 });
  let eqFound = false;
  if (eqO2 && eqO2.slopeAfter > 0 && eqO2.slopeAfter > eqO2.slopeBefore) {
    const after = below.filter((p) => p.timeS >= eqO2.x0);
    const co2 = after.length >= 4 ? fitHinge(after.map((p) => p.timeS), after.map((p) => (p.veLMin / p.vco2MlMin) * 1000), { minSegment: 2 }) : null;
    const co2Slope = co2 ? co2.slopeBefore : 0;
    // VE/VCO2 should stay flat: its rise must be well below that of VE/VO2.
    if (co2Slope < 0.5 * eqO2.slopeAfter) {
      eqFound = true;
      const eqVo2 = round(localMean(points, eqO2.x0, 15, (p) => p.vo2MlMin)!);
      results.push({ method: "ventilatory-equivalents", found: true, vo2MlMin: eqVo2, timeS: round(eqO2.x0), note: "VE/VO2 rises while VE/VCO2 stays flat" });
      const diff = Math.abs(eqVo2 - at.vo2MlMin);
      agreement = { differenceMlMin: round(diff), differencePct: round((100 * diff) / at.vo2MlMin, 1) };
      if (agreement.differencePct > 10) warnings.push(`V-slope and the ventilatory equivalents differ by ${agreement.differenceMlMin} mL/min (${agreement.differencePct} %); check the curves.`);
    }
  }
  if (!eqFound) {
    results.push({ method: "ventilatory-equivalents", found: false, vo2MlMin: null, timeS: null, note: "no rise of VE/VO2 with a flat VE/VCO2" });
    warnings.push("The ventilatory equivalents do not confirm VT1; it rests on the V-slope alone.");
  }
  return {
    vt1: {
      ...at,
      methods: results.filter((r) => r.found).map((r) => r.method),
      methodResults: results,
      agreement,
      confidence: confidenceOf(fit, ratio, agreement?.differencePct ?? null),
      warnings,
    },
    reason: null,
  };
}

export function analyzeBreaths(breaths: Breath[], opts: AnalysisOptions = {}): Analysis {
  const warnings: string[] = [];
  const { kept, removed } = removeAberrantBreaths(breaths, opts.cleaning);
  if (removed > 0) warnings.push(`${removed} aberrant breath(s) removed (coughs, swallows or sighs).`);
  const averaged = average(kept, opts.averaging ?? DEFAULT_AVERAGING);
  const peakWindow = highestWindowMean(kept, "vo2MlMin", 30);
  const mass = opts.bodyMassKg ?? null;
  const emptyPeak: Peak = { vo2MlMin: 0, vo2MlKgMin: null, hrBpm: null, rer: null, powerW: null, speedKmh: null, plateau: false };
  const base: Omit<Analysis, "vt1" | "vt2" | "vt1Reason" | "vt2Reason" | "peak"> = {
    warnings,
    points: averaged,
    onsetS: averaged[0]?.timeS ?? 0,
    endS: averaged[averaged.length - 1]?.timeS ?? 0,
    breathsRead: breaths.length,
    breathsRemoved: removed,
    columns: {},
  };
  if (!peakWindow || averaged.length < MIN_POINTS) {
    const reason = "Too few points to find thresholds: the test needs several minutes of data.";
    warnings.push(reason);
    const peak = peakWindow
      ? { ...emptyPeak, vo2MlMin: round(peakWindow.value), vo2MlKgMin: mass ? round(peakWindow.value / mass, 1) : null }
      : emptyPeak;
    return { ...base, vt1: null, vt1Reason: reason, vt2: null, vt2Reason: reason, peak };
  }
  const { onsetS, endS } = findSegment(averaged, peakWindow.endTimeS);
  const exercise = averaged.filter((p) => p.timeS >= onsetS && p.timeS <= endS);
  const detection = exercise.filter((p) => p.timeS >= onsetS + KINETICS_LAG_S);

  const hrs = exercise.map((p) => p.hrBpm).filter((v): v is number => v !== null);
  const rers = exercise.filter((p) => p.timeS >= onsetS + KINETICS_LAG_S).map((p) => p.vco2MlMin / p.vo2MlMin);
  const peakRer = rers.length ? Math.max(...rers) : null;
  const earlier = highestWindowMean(kept.filter((b) => b.timeS <= peakWindow.endTimeS - 60), "vo2MlMin", 30);
  const peak: Peak = {
    vo2MlMin: round(peakWindow.value),
    vo2MlKgMin: mass ? round(peakWindow.value / mass, 1) : null,
    hrBpm: hrs.length ? round(Math.max(...hrs)) : null,
    rer: peakRer === null ? null : round(peakRer, 2),
    powerW: ((v) => (v.length ? round(Math.max(...v)) : null))(exercise.map((p) => p.powerW).filter((v): v is number => v !== null)),
    speedKmh: ((v) => (v.length ? round(Math.max(...v), 1) : null))(exercise.map((p) => p.speedKmh).filter((v): v is number => v !== null)),
    // Plateau: less than 150 mL/min rise over the last minute (Taylor, Buskirk & Henschel 1955 criterion).
    plateau: earlier ? peakWindow.value - earlier.value < 150 : false,
  };
  if (peak.rer !== null && peak.rer < 1.05) {
    warnings.push(`Peak RER ${peak.rer} is below about 1.05: the test was probably not maximal, so VT2 and peak VO2 may be underestimated.`);
  }
  if (detection.length < MIN_POINTS) {
    const reason = "Too few points during exercise to find thresholds.";
    warnings.push(reason);
    return { ...base, onsetS, endS, vt1: null, vt1Reason: reason, vt2: null, vt2Reason: reason, peak };
  }
  const { vt2, reason: vt2Reason } = detectVt2(detection, mass);
  const { vt1, reason: vt1Reason } = detectVt1(detection, vt2, mass);
  if (!vt2 && vt2Reason) warnings.push(vt2Reason);
  if (!vt1 && vt1Reason) warnings.push(vt1Reason);
  if (vt1 && peak.vo2MlMin) {
    const pct = (100 * vt1.vo2MlMin) / peak.vo2MlMin;
    if (pct < 35 || pct > 85) vt1.warnings.push(`VT1 at ${round(pct)} % of peak VO2 is unusual (typically 45–70 %); check the curves.`);
  }
  if (vt2 && peak.vo2MlMin) {
    const pct = (100 * vt2.vo2MlMin) / peak.vo2MlMin;
    if (pct < 55 || pct > 98) vt2.warnings.push(`VT2 at ${round(pct)} % of peak VO2 is unusual (typically 70–90 %); check the curves.`);
  }
  return { ...base, onsetS, endS, vt1, vt1Reason, vt2, vt2Reason, peak };
}

export function analyzeCsv(text: string, opts: AnalysisOptions = {}): CsvAnalysis {
  const read = readGasExchangeCsv(text, opts.mapping);
  if (!read.ok) return read;
  const analysis = analyzeBreaths(read.breaths, opts);
  return { ok: true, ...analysis, columns: read.columns, warnings: [...read.warnings, ...analysis.warnings] };
}
