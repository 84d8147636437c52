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
import { fitHinge, fitLine, type HingeFit } from "./breakpoint";
import {
  average,
  DEFAULT_AVERAGING,
  highestWindowMean,
  removeAberrantBreaths,
  type Averaging,
  type CleanOptions,
} from "./clean";
import {
  readGasExchangeCsv,
  treadmillDemand,
  type Breath,
  type ColumnMapping,
  type DetectedColumn,
  type Channel,
  type UnitChoices,
} from "./csv";

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
  rer: number;
  hrBpm: number | null;
  /** Power and speed where VO2 showed the threshold on the ramp (VO2 lags the workload, so these sit above steady state). */
  powerW: number | null;
  speedKmh: number | null;
  gradePct: number | null;
  /** The workload one mean response time earlier: the steady-state equivalent (see `rampCorrection`). */
  steadyPowerW: number | null;
  steadySpeedKmh: number | null;
  steadyGradePct: number | null;
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
  gradePct: number | null;
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
  /** How the test segment was set: found from the workload, from VO2 (no workload column) or by the person. */
  segmentSource: "workload" | "vo2" | "chosen";
  /** The mean response time used to correct ramp workloads, in seconds. */
  meanResponseTimeS: number;
  breathsRead: number;
  breathsRemoved: number;
  columns: Partial<Record<Channel, DetectedColumn>>;
}

export interface AnalysisOptions {
  mapping?: ColumnMapping;
  units?: UnitChoices;
  /** The test segment set by a person (seconds from the file's time origin); either end may be left to the finder. */
  segment?: { fromS?: number | null; toS?: number | null };
  /** Mean response time of VO2 on a ramp, for the workload correction (default 40 s). */
  meanResponseTimeS?: number;
  bodyMassKg?: number | null;
  averaging?: Averaging;
  cleaning?: CleanOptions;
}

export type CsvAnalysis = ({ ok: true } & Analysis) | { ok: false; error: string; headers: string[] };

/** Fewest averaged points (of 15 s) for a threshold search: four minutes of exercise (a test segment this short is
 * searched, with the short-test warning below). Coarser rows need fewer (see `minPointsFor`). */
const MIN_POINTS = 16;
/** The same four minutes in rows `spacingS` apart (a file already averaged every 30 s has half as many rows). */
const minPointsFor = (spacingS: number) => Math.max(8, Math.ceil((MIN_POINTS * 15) / Math.max(15, spacingS)));
/**
 * A test segment shorter than this (minutes) gets a warning: ramps of 8–12 minutes give the clearest thresholds (Buchfuhrer
 * et al. 1983, J Appl Physiol 55:1558–1564). `npm run validate` shows VT1 detection by ramp length.
 */
const SHORT_TEST_MIN = 8;
/** Points this soon after the segment starts are left out of the threshold search while VO2 catches up. */
const KINETICS_LAG_S = 30;
/**
 * Ramp correction: VO2 follows a ramp with a delay, the mean response time (MRT), so the workload at which VO2 shows a
 * threshold is higher than the steady-state workload of that VO2; the steady-state equivalent is the workload one MRT
 * earlier (workload − ramp rate × MRT; Whipp, Davis, Torres & Wasserman 1981, J Appl Physiol 50:217–221). 40 s is a typical
 * MRT of healthy adults on moderate ramps (Boone & Bourgois 2012, Sports Med 42:511–526; value from memory).
 */
export const DEFAULT_MRT_S = 40;

const round = (v: number, digits = 0) => {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
};
const clamp01 = (v: number) => Math.max(0, Math.min(1, v));

/** Power in W, or for a treadmill the ACSM VO2 demand of its speed and grade (mL/kg/min), so that a grade ramp after a
 * speed ramp still rises. Only the order of these values matters to the segment finder. */
function workload(b: Breath): number | null {
  if (b.powerW !== null) return b.powerW;
  if (b.speedKmh !== null) return treadmillDemand(b.speedKmh, b.gradePct);
  return null;
}

function runningMedianOf(values: number[], half: number): number[] {
  return values.map((_, i) => {
    const w = values
      .slice(Math.max(0, i - half), i + half + 1)
      .filter(Number.isFinite)
      .sort((a, b) => a - b);
    return w.length ? w[w.length >> 1]! : NaN;
  });
}

/** Mean of a field over points within ±halfS of t, or null. */
function localMean(points: Breath[], t: number, halfS: number, f: (b: Breath) => number | null): number | null {
  let s = 0,
    c = 0;
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

/**
 * A signal smoothed over time by a local straight line through the points within ±halfS: on a ramp the line keeps the
 * signal's slope, so the smoothed value carries no lag.
 */
function localLinear(points: Breath[], halfS: number, f: (b: Breath) => number): number[] {
  return points.map((p) => {
    let n = 0,
      st = 0,
      sv = 0,
      stt = 0,
      stv = 0;
    for (const q of points) {
      const d = q.timeS - p.timeS;
      if (d < -halfS) continue;
      if (d > halfS) break;
      const v = f(q);
      n++;
      st += d;
      sv += v;
      stt += d * d;
      stv += d * v;
    }
    const den = n * stt - st * st;
    return den > 1e-9 ? (sv * stt - st * stv) / den : sv / n;
  });
}

function nearest(points: Breath[], t: number): Breath {
  return points.reduce((best, p) => (Math.abs(p.timeS - t) < Math.abs(best.timeS - t) ? p : best), points[0]!);
}

/** The time at which a rising signal reaches `value`: median time of the points within 3 % of it. */
function timeAtValue(points: Breath[], value: number, f: (b: Breath) => number): number {
  let near = points.filter((p) => Math.abs(f(p) - value) <= 0.03 * value).map((p) => p.timeS);
  if (near.length === 0) {
    const closest = points.reduce(
      (best, p) => (Math.abs(f(p) - value) < Math.abs(f(best) - value) ? p : best),
      points[0]!,
    );
    near = [closest.timeS];
  }
  near.sort((a, b) => a - b);
  return near[near.length >> 1]!;
}

/**
 * The test segment: the last rising run of the workload up to where it ends. Walking back from the end (the last point at
 * 97 % of the highest smoothed workload), each fall in workload larger than 3 % of its range is a step of the ramp; the run
 * stops where the workload was higher before (a warm-up at a higher speed), or where it stayed level for longer than a
 * stage of this test could (2.5 times the test's usual step interval, at least 150 s: rest, a warm-up, a constant stage).
 * Without a workload the same is done on VO2 itself.
 */
/** How long (s) an earlier, higher workload must last to end the test segment (common practice: a warm-up lasts minutes). */
const HIGHER_FOR_S = 60;

function findSegment(points: Breath[], peakEndS: number): { onsetS: number; endS: number; source: "workload" | "vo2" } {
  const hasLoad = points.filter((p) => workload(p) !== null).length > points.length * 0.5;
  const raw = points.map((p) => (hasLoad ? (workload(p) ?? NaN) : p.vo2MlMin));
  const load = runningMedianOf(raw, 3);
  const finite = load.filter(Number.isFinite);
  if (finite.length < 3) return { onsetS: points[0]!.timeS, endS: peakEndS, source: hasLoad ? "workload" : "vo2" };
  const maxLoad = Math.max(...finite),
    minLoad = Math.min(...finite);
  // A measured workload (a rowing ergometer's stroke power) is noisy: the tolerance is also three times its typical
  // point-to-point change after smoothing.
  const diffs: number[] = [];
  for (let i = 1; i < load.length; i++)
    if (Number.isFinite(load[i]!) && Number.isFinite(load[i - 1]!)) diffs.push(Math.abs(load[i]! - load[i - 1]!));
  diffs.sort((x, y) => x - y);
  const jitter = diffs.length ? diffs[diffs.length >> 1]! : 0;
  const rawDiffs: number[] = [];
  for (let i = 1; i < raw.length; i++)
    if (Number.isFinite(raw[i]!) && Number.isFinite(raw[i - 1]!)) rawDiffs.push(Math.abs(raw[i]! - raw[i - 1]!));
  rawDiffs.sort((x, y) => x - y);
  const rawJitter = rawDiffs.length ? rawDiffs[rawDiffs.length >> 1]! : 0;
  const tol = Math.max(1e-9, (hasLoad ? 0.03 : 0.06) * (maxLoad - minLoad), 3 * jitter, rawJitter);
  let endIdx = 0;
  load.forEach((l, i) => {
    if (l >= maxLoad - 0.03 * (maxLoad - minLoad)) endIdx = i;
  });
  if (!hasLoad) {
    // VO2 peaks at the end of exercise; the first point at the peak level ends the rise.
    endIdx = load.findIndex((l) => l >= maxLoad - 0.03 * (maxLoad - minLoad));
  }
  const endS = hasLoad
    ? Math.max(points[endIdx]!.timeS, Math.min(peakEndS, points[endIdx]!.timeS + 30))
    : Math.max(points[endIdx]!.timeS, peakEndS);
  // Steps going back in time.
  const steps: number[] = [];
  let level = load[endIdx]!;
  // A higher workload earlier only ends the run when it lasted (the median of the minute before it is higher too): a
  // warm-up at a higher load lasts minutes, while a measured stroke power jumps about from one point to the next.
  const higherFor = (i: number) => {
    const before: number[] = [];
    for (let j = i; j >= 0 && points[i]!.timeS - points[j]!.timeS <= HIGHER_FOR_S; j--)
      if (Number.isFinite(load[j]!)) before.push(load[j]!);
    before.sort((x, y) => x - y);
    return before[before.length >> 1]! > level + tol;
  };
  let lastStep = endIdx;
  let onsetIdx = 0;
  for (let i = endIdx - 1; i >= 0; i--) {
    const l = load[i]!;
    if (!Number.isFinite(l)) continue;
    if (l > level + tol && higherFor(i)) {
      onsetIdx = lastStep;
      break;
    }
    if (l < level - tol) {
      steps.push(points[lastStep]!.timeS - points[i]!.timeS);
      level = l;
      lastStep = i;
      continue;
    }
    const usual = steps.length >= 2 ? [...steps].sort((x, y) => x - y)[steps.length >> 1]! : 180;
    if (points[lastStep]!.timeS - points[i]!.timeS > Math.max(150, 2.5 * usual)) {
      onsetIdx = lastStep;
      break;
    }
    onsetIdx = i;
  }
  // A level start longer than one of the test's own steps is a warm-up, not a stage: the test starts where it ends.
  const usualStep = steps.length >= 2 ? [...steps].sort((x, y) => x - y)[steps.length >> 1]! : 180;
  if (lastStep > onsetIdx && points[lastStep]!.timeS - points[onsetIdx]!.timeS > 1.5 * usualStep) onsetIdx = lastStep;
  // A continuous ramp rises by less than the step tolerance from one point to the next, so the walk above finds its start
  // up to a tolerance late (three rows of a 30-s export). Follow the rise back while it keeps falling by a ramp's own
  // increment (at least half the typical change, at most twice it): a jump from a lower warm-up is larger and ends it.
  for (let i = onsetIdx; i > 0; i--) {
    const here = load[i]!,
      before = load[i - 1]!;
    if (!Number.isFinite(here) || !Number.isFinite(before)) break;
    const fall = here - before;
    if (!(fall > 0.5 * jitter && fall <= 2 * jitter) || jitter <= 0) break;
    onsetIdx = i - 1;
  }
  return { onsetS: points[Math.max(0, onsetIdx)]!.timeS, endS, source: hasLoad ? "workload" : "vo2" };
}

function confidenceOf(fit: HingeFit, slopeRatio: number, agreementPct: number | null): number {
  const fitScore = clamp01(fit.gain / 0.4);
  const slopeScore = clamp01((slopeRatio - 1) / 0.3);
  const agreementScore = agreementPct === null ? 0 : clamp01(1 - agreementPct / 10);
  return round(0.35 * fitScore + 0.25 * slopeScore + 0.4 * agreementScore, 2);
}

/** The numbers at a moment of the test (means over ±15 s): used for detected thresholds and while a coach drags a marker.
 * The steady-state workload is the one a mean response time earlier (see DEFAULT_MRT_S). */
export function valuesAt(points: Breath[], t: number, bodyMassKg?: number | null, mrtS: number = DEFAULT_MRT_S) {
  return describeAt(points, t, bodyMassKg, mrtS);
}

function describeAt(points: Breath[], t: number, bodyMassKg: number | null | undefined, mrtS: number = DEFAULT_MRT_S) {
  const vo2 = localMean(points, t, 15, (p) => p.vo2MlMin) ?? nearest(points, t).vo2MlMin;
  const vco2 = localMean(points, t, 15, (p) => p.vco2MlMin) ?? nearest(points, t).vco2MlMin;
  const r = (v: number | null, d = 0) => (v === null ? null : round(v, d));
  const power = (at: number) => r(localMean(points, at, 15, (p) => p.powerW));
  const speed = (at: number) =>
    r(
      localMean(points, at, 15, (p) => p.speedKmh),
      1,
    );
  const grade = (at: number) =>
    r(
      localMean(points, at, 15, (p) => p.gradePct ?? null),
      1,
    );
  const earlier = Math.max(points[0]?.timeS ?? 0, t - mrtS);
  return {
    vo2MlMin: round(vo2),
    vo2MlKgMin: bodyMassKg ? round(vo2 / bodyMassKg, 1) : null,
    vco2MlMin: round(vco2),
    rer: round(vco2 / vo2, 2),
    hrBpm: r(localMean(points, t, 15, (p) => p.hrBpm)),
    powerW: power(t),
    speedKmh: speed(t),
    gradePct: grade(t),
    steadyPowerW: power(earlier),
    steadySpeedKmh: speed(earlier),
    steadyGradePct: grade(earlier),
    timeS: round(t),
  };
}

/** VT2: breakpoint of VE against VCO2 (slope must rise), cross-checked with the rise of VE/VCO2 over time. */
function detectVt2(
  points: Breath[],
  bodyMassKg: number | null | undefined,
  mrtS: number,
): { vt2: Threshold | null; reason: string | null } {
  const xs = points.map((p) => p.vco2MlMin);
  const ys = points.map((p) => p.veLMin);
  const lo = Math.min(...xs),
    hi = Math.max(...xs);
  const fit = fitHinge(xs, ys, { minSegment: 4, range: [lo + 0.4 * (hi - lo), lo + 0.97 * (hi - lo)] });
  if (!fit) return { vt2: null, reason: "VT2 not found: too few points above the lower part of the test." };
  const ratio = fit.slopeBefore > 0 ? fit.slopeAfter / fit.slopeBefore : 0;
  if (ratio < 1.15 || fit.gain < 0.1) {
    return {
      vt2: null,
      reason:
        "VT2 not found: VE rises in proportion to VCO2 to the end (no respiratory compensation point; the test may have stopped before it).",
    };
  }
  const t = timeAtValue(points, fit.x0, (p) => p.vco2MlMin);
  const at = describeAt(points, t, bodyMassKg, mrtS);
  // Cross-check: VE/VCO2 over time, breakpoint where it starts to rise.
  const upper = points.filter(
    (p) => p.timeS >= points[0]!.timeS + 0.3 * (points[points.length - 1]!.timeS - points[0]!.timeS),
  );
  const eq = fitHinge(
    upper.map((p) => p.timeS),
    upper.map((p) => (p.veLMin / p.vco2MlMin) * 1000),
    { minSegment: 4 },
  );
  const results: MethodResult[] = [
    {
      method: "ve-vco2-slope",
      found: true,
      vo2MlMin: at.vo2MlMin,
      timeS: at.timeS,
      note: `VE/VCO2 slope ${round(fit.slopeBefore * 1000, 1)} → ${round(fit.slopeAfter * 1000, 1)}`,
    },
  ];
  let agreement: Threshold["agreement"] = null;
  const warnings: string[] = [];
  if (eq && eq.slopeAfter > 0 && eq.slopeAfter > eq.slopeBefore + 1e-4) {
    const eqVo2 = round(localMean(points, eq.x0, 15, (p) => p.vo2MlMin)!);
    results.push({
      method: "ve-vco2-ratio",
      found: true,
      vo2MlMin: eqVo2,
      timeS: round(eq.x0),
      note: "VE/VCO2 starts to rise",
    });
    const diff = Math.abs(eqVo2 - at.vo2MlMin);
    agreement = { differenceMlMin: round(diff), differencePct: round((100 * diff) / at.vo2MlMin, 1) };
    if (agreement.differencePct > 10)
      warnings.push(
        `The two VT2 methods differ by ${agreement.differenceMlMin} mL/min (${agreement.differencePct} %); check the curves.`,
      );
  } else {
    results.push({
      method: "ve-vco2-ratio",
      found: false,
      vo2MlMin: null,
      timeS: null,
      note: "no clear rise of VE/VCO2",
    });
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

/** VT1: V-slope up to VT2, cross-checked with the ventilatory equivalents. */
/**
 * Plausible V-slope lower slopes: Beaver, Wasserman & Whipp 1986 describe a lower segment with a slope near 1 (slightly
 * below it) and an upper one clearly above 1. A lower slope far from 1 means the fit bent around something else (the
 * slow rise of VCO2 at exercise onset, or hyperventilation); such a fit is retried without the earliest points, then refused.
 */
const VSLOPE_LOWER = [0.6, 1.15] as const;

/** Points this soon after the segment starts are left out of the VT1 search: VCO2 catches up more slowly than VO2 after a
 * change of workload (its stores), which bends the V-slope's lower segment (Beaver, Wasserman & Whipp 1986 leave out the
 * first minute of the ramp for the same reason). */
const VT1_ONSET_S = 60;
/** Half-width of the time window over which VO2 is smoothed for the V-slope axis. */
const SMOOTH_HALF_S = 45;
/**
 * ...and at least this many rows on each side of a point: ±45 s holds three 15-s bins of a breath-by-breath file on each
 * side, but only one row of an export averaged every 30 s, whose V-slope axis then kept most of the rows' scatter. Such an
 * export is smoothed over ±90 s, the same three rows a side; breath files and 10- or 15-s exports are unchanged.
 */
const SMOOTH_SIDE_ROWS = 3;
/** Half-width of the time window of the local line whose slope says how fast VCO2 and VE are changing. */
const SLOPE_HALF_S = 60;
/**
 * The CO2 the muscles produce reaches the mouth later than the O2 they take up changes there: the body's CO2 stores fill
 * first (Whipp & Ward 1990, Med Sci Sports Exerc 22:62–71). The delay is modelled as a first-order response with this time
 * constant (s; from memory, about 10–20 s). `npm run validate` shows the suite at 10, 15 and 20 s alike (docs/thresholds.md).
 */
const CO2_STORE_S = 15;

/** Slope (per second) of the local straight line through the points within ±halfS of each point. */
function localSlope(points: Breath[], halfS: number, values: number[]): number[] {
  return points.map((p) => {
    let n = 0,
      st = 0,
      sv = 0,
      stt = 0,
      stv = 0;
    for (let k = 0; k < points.length; k++) {
      const d = points[k]!.timeS - p.timeS;
      if (d < -halfS) continue;
      if (d > halfS) break;
      const v = values[k]!;
      n++;
      st += d;
      sv += v;
      stt += d * d;
      stv += d * v;
    }
    const den = n * stt - st * st;
    return den > 1e-9 ? (n * stv - st * sv) / den : 0;
  });
}

/**
 * The V-slope axes. x is VO2 smoothed over time (±SMOOTH_HALF_S). co2 and ve are each breath's VCO2/VO2 and VE/VO2 times
 * that smoothed VO2 (breath-to-breath changes of tidal volume move the gases together, so their ratios are far steadier than
 * any gas alone), corrected for the CO2 stores: a signal that trails another through a first-order response of time
 * constant τ lags it by τ × its rate of change, so CO2_STORE_S × the local slope is added back. Without this the lag rounds
 * the V-slope's corner and, wherever the workload rises unevenly (steps, a walk-to-run change), draws loops that pull the
 * breakpoint about.
 */
function vSlopeAxes(points: Breath[], spacingS: number): { x: number[]; co2: number[]; ve: number[] } {
  const smooth = localLinear(points, Math.max(SMOOTH_HALF_S, SMOOTH_SIDE_ROWS * spacingS), (p) => p.vo2MlMin);
  // The slopes of the gases as measured (not of the ratios), which follow the smooth course of the test.
  const dVco2 = localSlope(
    points,
    SLOPE_HALF_S,
    points.map((p) => p.vco2MlMin),
  );
  const dVe = localSlope(
    points,
    SLOPE_HALF_S,
    points.map((p) => p.veLMin),
  );
  return {
    x: smooth,
    co2: points.map((p, i) => (p.vco2MlMin / p.vo2MlMin) * smooth[i]! + CO2_STORE_S * dVco2[i]!),
    ve: points.map((p, i) => (p.veLMin / p.vo2MlMin) * smooth[i]! + CO2_STORE_S * dVe[i]!),
  };
}

function detectVt1(
  points: Breath[],
  vt2: Threshold | null,
  bodyMassKg: number | null | undefined,
  mrtS: number,
  minPoints = MIN_POINTS,
  spacingS = 15,
): { vt1: Threshold | null; reason: string | null } {
  const axes = vSlopeAxes(points, spacingS);
  const first = points.findIndex((p) => p.timeS >= points[0]!.timeS + VT1_ONSET_S);
  const endBelow = vt2 ? points.findIndex((p) => p.timeS >= vt2.timeS) : points.length;
  const belowCount = (endBelow < 0 ? points.length : endBelow) - Math.max(0, first);
  if (first < 0 || belowCount < minPoints / 2)
    return { vt1: null, reason: "VT1 not found: too few points below the respiratory compensation point." };
  // Points above VT2 stay in the fit with a knot of their own at VT2 (VCO2 and VE bend again there): they steady the
  // upper segment, which below VT2 alone is often short.
  const knot = vt2 && endBelow > 0 ? axes.x[endBelow]! : undefined;
  // Near peak VO2 levels off or even falls while VCO2 still climbs: the points after the highest smoothed VO2 are left out.
  let top = 0;
  for (let i = 1; i < axes.x.length; i++) if (axes.x[i]! > axes.x[top]!) top = i;
  const stopAll = Math.max(top + 1, endBelow < 0 ? points.length : endBelow);
  let fit: HingeFit | null = null;
  let from = first;
  let below: Breath[] = [];
  let axis: number[] = [];
  let rejected: string | null = null;
  // Try the whole stretch below VT2, then without its first 15 % and 30 % (exercise-onset kinetics).
  for (const skip of [0, 0.15, 0.3]) {
    from = first + Math.floor(belowCount * skip);
    if (belowCount - (from - first) < Math.max(knot === undefined ? 8 : 6, minPoints / 2)) break;
    below = points.slice(from, first + belowCount);
    axis = axes.x.slice(from, stopAll);
    const ys = axes.co2.slice(from, stopAll);
    const lo = Math.min(...axis.slice(0, below.length)),
      hi = knot ?? Math.max(...axis);
    const f = fitHinge(axis, ys, {
      minSegment: 4,
      range: [lo + 0.1 * (hi - lo), lo + 0.9 * (hi - lo)],
      knot,
      posteriorDof: 1,
    });
    if (!f) break;
    if (f.slopeAfter <= 1 || f.slopeAfter - f.slopeBefore < 0.1 || f.gain < 0.1) {
      // No breakpoint at all: dropping early points would only find one in the noise.
      rejected ??= "VT1 not found: VCO2 rises in proportion to VO2 throughout (no clear V-slope breakpoint).";
      break;
    }
    if (f.slopeBefore < VSLOPE_LOWER[0] || f.slopeBefore > VSLOPE_LOWER[1]) {
      rejected = `VT1 not found: the V-slope fit's lower slope is ${round(f.slopeBefore, 2)}, far from the slope near 1 expected below VT1 (Beaver, Wasserman & Whipp 1986); the early part of the test may be distorted. Set the test segment or place VT1 by hand.`;
      continue;
    }
    fit = f;
    break;
  }
  if (!fit) return { vt1: null, reason: rejected ?? "VT1 not found: too few points for the V-slope method." };
  const slopeRatio = fit.slopeBefore > 0 ? fit.slopeAfter / fit.slopeBefore : 0;
  const vslopeVo2 = fit.x0;
  const vslopeT = timeAtValue(below, vslopeVo2, (p) => p.vo2MlMin);
  const results: MethodResult[] = [
    {
      method: "v-slope",
      found: true,
      vo2MlMin: round(vslopeVo2),
      timeS: round(vslopeT),
      note: `VCO2/VO2 slope ${round(fit.slopeBefore, 2)} → ${round(fit.slopeAfter, 2)}`,
    },
  ];
  const warnings: string[] = [];
  let agreement: Threshold["agreement"] = null;
  // Ventilatory equivalents: VE/VO2 starts to rise (VE against VO2 on the same axis, with its own breakpoint) while
  // VE/VCO2 stays flat. It confirms the V-slope (two methods that agree are more trustworthy than either alone: Gaskill et
  // al. 2001, Med Sci Sports Exerc 33:1841–1848) but is not averaged in: VE scatters more from breath to breath than VCO2,
  // and on the validation suite its breakpoint scatters about 1.5 times as widely around the truth as the V-slope's.
  const axisBelow = axis.slice(0, below.length);
  const lo = Math.min(...axisBelow),
    hi = Math.max(...axisBelow);
  // VE's slope from the points below VT2 only: above it VE climbs steeply, which would inflate the last minute below it.
  const veBelow = vSlopeAxes(below, spacingS);
  const eqO2 = fitHinge(veBelow.x, veBelow.ve, {
    minSegment: 4,
    range: [lo + 0.1 * (hi - lo), lo + 0.9 * (hi - lo)],
  });
  let eqFound = false;
  const reported = vslopeVo2;
  if (eqO2 && eqO2.slopeAfter > 1.1 * eqO2.slopeBefore && eqO2.gain >= 0.1) {
    const after = below.filter((_, i) => axis[i]! >= eqO2.x0);
    const afterAxis = axis.slice(0, below.length).filter((x) => x >= eqO2.x0);
    // VE/VCO2 should stay flat above it: its relative rise must be well below that of VE/VO2.
    const co2 =
      after.length >= 4
        ? fitLine(
            afterAxis,
            after.map((p) => (p.veLMin / p.vco2MlMin) * 1000),
          )
        : null;
    const o2 =
      after.length >= 4
        ? fitLine(
            afterAxis,
            after.map((p) => (p.veLMin / p.vo2MlMin) * 1000),
          )
        : null;
    const meanOf = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
    const rel = (l: { slope: number } | null, v: number[]) => (l ? l.slope / meanOf(v) : 0);
    const co2Rise = co2
      ? rel(
          co2,
          after.map((p) => (p.veLMin / p.vco2MlMin) * 1000),
        )
      : 0;
    const o2Rise = o2
      ? rel(
          o2,
          after.map((p) => (p.veLMin / p.vo2MlMin) * 1000),
        )
      : 0;
    if (o2Rise > 0 && co2Rise < 0.5 * o2Rise) {
      eqFound = true;
      const eqT = timeAtValue(below, eqO2.x0, (p) => p.vo2MlMin);
      results.push({
        method: "ventilatory-equivalents",
        found: true,
        vo2MlMin: round(eqO2.x0),
        timeS: round(eqT),
        note: "VE/VO2 rises while VE/VCO2 stays flat",
      });
      const diff = Math.abs(eqO2.x0 - vslopeVo2);
      agreement = { differenceMlMin: round(diff), differencePct: round((100 * diff) / vslopeVo2, 1) };
      if (agreement.differencePct > 10)
        warnings.push(
          `V-slope and the ventilatory equivalents differ by ${agreement.differenceMlMin} mL/min (${agreement.differencePct} %); VT1 is the V-slope value. Check the curves.`,
        );
    }
  }
  if (!eqFound) {
    results.push({
      method: "ventilatory-equivalents",
      found: false,
      vo2MlMin: null,
      timeS: null,
      note: "no rise of VE/VO2 with a flat VE/VCO2",
    });
    warnings.push("The ventilatory equivalents do not confirm VT1; it rests on the V-slope alone.");
  }
  const t = timeAtValue(below, reported, (p) => p.vo2MlMin);
  const at = describeAt(points, t, bodyMassKg, mrtS);
  at.vo2MlMin = round(reported);
  at.vo2MlKgMin = bodyMassKg ? round(reported / bodyMassKg, 1) : null;
  return {
    vt1: {
      ...at,
      methods: results.filter((r) => r.found).map((r) => r.method),
      methodResults: results,
      agreement,
      confidence: confidenceOf(fit, slopeRatio, agreement?.differencePct ?? null),
      warnings,
    },
    reason: null,
  };
}

export function analyzeBreaths(breaths: Breath[], opts: AnalysisOptions = {}): Analysis {
  const warnings: string[] = [];
  // A file whose rows are already averaged (10, 15, 30 s …) is used as it is: no breath cleaning, no second binning.
  const steps: number[] = [];
  for (let i = 1; i < Math.min(breaths.length, 500); i++) steps.push(breaths[i]!.timeS - breaths[i - 1]!.timeS);
  steps.sort((a, b) => a - b);
  const preAveraged = !opts.averaging && steps.length > 10 && steps[steps.length >> 1]! >= 8;
  const { kept, removed } = preAveraged ? { kept: breaths, removed: 0 } : removeAberrantBreaths(breaths, opts.cleaning);
  if (removed > 0) warnings.push(`${removed} aberrant breath(s) removed (coughs, swallows or sighs).`);
  if (preAveraged)
    warnings.push(`The rows are already averaged (every ${round(steps[steps.length >> 1]!)} s): used as they are.`);
  const averaged = preAveraged ? kept : average(kept, opts.averaging ?? DEFAULT_AVERAGING);
  const peakWindow = highestWindowMean(kept, "vo2MlMin", 30);
  const mass = opts.bodyMassKg ?? null;
  const emptyPeak: Peak = {
    vo2MlMin: 0,
    vo2MlKgMin: null,
    hrBpm: null,
    rer: null,
    powerW: null,
    speedKmh: null,
    gradePct: null,
    plateau: false,
  };
  const base: Omit<Analysis, "vt1" | "vt2" | "vt1Reason" | "vt2Reason" | "peak"> = {
    warnings,
    points: averaged,
    onsetS: averaged[0]?.timeS ?? 0,
    endS: averaged[averaged.length - 1]?.timeS ?? 0,
    segmentSource: "workload",
    meanResponseTimeS: opts.meanResponseTimeS ?? DEFAULT_MRT_S,
    breathsRead: breaths.length,
    breathsRemoved: removed,
    columns: {},
  };
  const spacingS = preAveraged ? steps[steps.length >> 1]! : opts.averaging?.mode === "time" ? opts.averaging.binS : 15;
  const minPoints = minPointsFor(spacingS);
  if (!peakWindow || averaged.length < minPoints) {
    const reason = "Too few points to find thresholds: the test needs several minutes of data.";
    warnings.push(reason);
    const peak = peakWindow
      ? { ...emptyPeak, vo2MlMin: round(peakWindow.value), vo2MlKgMin: mass ? round(peakWindow.value / mass, 1) : null }
      : emptyPeak;
    return { ...base, vt1: null, vt1Reason: reason, vt2: null, vt2Reason: reason, peak };
  }
  const found = findSegment(averaged, peakWindow.endTimeS);
  const chosenFrom = opts.segment?.fromS ?? null,
    chosenTo = opts.segment?.toS ?? null;
  const onsetS = chosenFrom ?? found.onsetS;
  const endS = chosenTo ?? found.endS;
  const segmentSource = chosenFrom !== null || chosenTo !== null ? "chosen" : found.source;
  if (segmentSource === "vo2")
    warnings.push(
      "The file has no workload column: the test segment was found from VO2 alone; check its start and end.",
    );
  const exercise = averaged.filter((p) => p.timeS >= onsetS && p.timeS <= endS);
  const detection = exercise.filter((p) => p.timeS >= onsetS + KINETICS_LAG_S);

  const hrs = exercise.map((p) => p.hrBpm).filter((v): v is number => v !== null);
  // Peak RER: over the same 30 s as peak VO2, not the highest value of the test (an early hyperventilation would win).
  const inPeak = kept.filter((b) => b.timeS > peakWindow.endTimeS - 30 && b.timeS <= peakWindow.endTimeS);
  const peakRer = inPeak.length
    ? inPeak.reduce((s, b) => s + b.vco2MlMin, 0) / inPeak.reduce((s, b) => s + b.vo2MlMin, 0)
    : null;
  const earlier = highestWindowMean(
    kept.filter((b) => b.timeS <= peakWindow.endTimeS - 60),
    "vo2MlMin",
    30,
  );
  const maxOf = (v: (number | null | undefined)[], d = 0) =>
    ((f) => (f.length ? round(Math.max(...f), d) : null))(v.filter((x): x is number => x !== null && x !== undefined));
  const peak: Peak = {
    vo2MlMin: round(peakWindow.value),
    vo2MlKgMin: mass ? round(peakWindow.value / mass, 1) : null,
    hrBpm: hrs.length ? round(Math.max(...hrs)) : null,
    rer: peakRer === null ? null : round(peakRer, 2),
    powerW: maxOf(exercise.map((p) => p.powerW)),
    speedKmh: maxOf(
      exercise.map((p) => p.speedKmh),
      1,
    ),
    gradePct: maxOf(
      exercise.map((p) => p.gradePct),
      1,
    ),
    // Plateau: less than 150 mL/min rise over the last minute (Taylor, Buskirk & Henschel 1955 criterion).
    plateau: earlier ? peakWindow.value - earlier.value < 150 : false,
  };
  if (peak.rer !== null && peak.rer < 1.05) {
    warnings.push(
      `Peak RER ${peak.rer} is below about 1.05: the test was probably not maximal, so VT2 and peak VO2 may be underestimated.`,
    );
  }
  if (detection.length < minPoints) {
    const reason = `Too few points during exercise to find thresholds: the test segment holds ${detection.length} points (${round((endS - onsetS) / 60, 1)} min); at least ${minPoints} (about 4 minutes of exercise) are needed. Check the test segment and the time column, or place the thresholds by hand.`;
    warnings.push(reason);
    return { ...base, onsetS, endS, segmentSource, vt1: null, vt1Reason: reason, vt2: null, vt2Reason: reason, peak };
  }
  const rampMin = (endS - onsetS) / 60;
  if (rampMin < SHORT_TEST_MIN) {
    warnings.push(
      `The test segment lasts ${round(rampMin, 1)} min: thresholds from tests shorter than about 8 minutes are less certain (a ramp of 8–12 min is recommended: Buchfuhrer et al. 1983). Check the curves or retest with a slower ramp.`,
    );
  }
  const mrtS = opts.meanResponseTimeS ?? DEFAULT_MRT_S;
  const { vt2, reason: vt2Reason } = detectVt2(detection, mass, mrtS);
  const { vt1, reason: vt1Reason } = detectVt1(detection, vt2, mass, mrtS, minPoints, spacingS);
  if (!vt2 && vt2Reason) warnings.push(vt2Reason);
  if (!vt1 && vt1Reason) warnings.push(vt1Reason);
  if (vt1 && peak.vo2MlMin) {
    const pct = (100 * vt1.vo2MlMin) / peak.vo2MlMin;
    if (pct < 35 || pct > 85)
      vt1.warnings.push(`VT1 at ${round(pct)} % of peak VO2 is unusual (typically 45–70 %); check the curves.`);
  }
  if (vt2 && peak.vo2MlMin) {
    const pct = (100 * vt2.vo2MlMin) / peak.vo2MlMin;
    if (pct < 55 || pct > 98)
      vt2.warnings.push(`VT2 at ${round(pct)} % of peak VO2 is unusual (typically 70–90 %); check the curves.`);
  }
  return { ...base, onsetS, endS, segmentSource, vt1, vt1Reason, vt2, vt2Reason, peak };
}

export function analyzeCsv(text: string, opts: AnalysisOptions = {}): CsvAnalysis {
  return analyzeRead(readGasExchangeCsv(text, opts.mapping, { bodyMassKg: opts.bodyMassKg, units: opts.units }), opts);
}

/** The analysis of a table already read (CSV or spreadsheet): one engine for every input. */
export function analyzeRead(read: ReturnType<typeof readGasExchangeCsv>, opts: AnalysisOptions = {}): CsvAnalysis {
  if (!read.ok) return read;
  const analysis = analyzeBreaths(read.breaths, { ...opts, bodyMassKg: opts.bodyMassKg ?? read.bodyMassFromFileKg });
  return { ok: true, ...analysis, columns: read.columns, warnings: [...read.warnings, ...analysis.warnings] };
}
