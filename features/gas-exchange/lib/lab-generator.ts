/**
 * Lab-realistic gas-exchange tests with known thresholds, for the validation suite (`npm run validate`) and its subset in
 * the unit tests. Every protocol, phase pattern and export style the engine claims to read is generated here.
 *
 * The model (documented so that the figures are reproducible; the shapes are textbook, the numbers chosen here):
 * - Workload → steady-state VO2: ACSM leg cycling (VO2 = 7·mass + 1.8·6.12·W mL/min) for cycling and rowing, ACSM walking and
 *   running demand × mass × a personal economy factor (0.9–1.1) for treadmills (ACSM's Guidelines for Exercise Testing and
 *   Prescription).
 * - VO2 follows the steady state with first-order kinetics (time constant 25–45 s; common practice, from memory).
 * - The metabolic CO2 output is two straight lines of the VO2 of the moment meeting at VT1 (slopes about 0.9 below and
 *   1.3–1.5 above, the picture of Beaver, Wasserman & Whipp 1986); the measured VCO2 trails it with a first-order response
 *   of 10–20 s (the body's CO2 stores; from memory), so the onset of exercise and every step bend the V-slope as real tests
 *   do. The true VT1 is that breakpoint in VO2: the same on any ramp slope, as Davis et al. 1982 found.
 * - VE is two straight lines of VCO2 meeting at VT2 (VE/VCO2 slope 22–30 below, ×1.7–2.2 above; from memory).
 * - Breath noise: a shared tidal-volume factor (SD 6–9 %) and independent noise per gas (BREATH_NOISE, matched to the real
 *   files); 2 % aberrant breaths; some tests
 *   hyperventilate for the first 40 s of exercise (RER above 1).
 * Thresholds are fractions of the ramp's VO2 range, so the true VT1 and VT2 VO2 are known exactly; peak VO2 is the highest
 * 30-s mean of the noise-free VO2.
 */
import { treadmillDemand } from "./csv";
import { mulberry32 } from "./synthetic-ramp";

export const PROTOCOLS = [
  "cycle-ramp",
  "cycle-steps-1min",
  "cycle-steps-3min",
  "rowing-ramp",
  "treadmill-speed-grade",
  "treadmill-steps",
] as const;
export const PHASES = ["warmup", "rest-warmup-stage", "varied-warmup", "no-warmup"] as const;
export const EXPORTS = [
  "breath",
  "avg-10s",
  "avg-15s",
  "avg-30s",
  "relative-first",
  "repaired-names",
  "bracket-units",
  "minutes",
  "mmss-mph-sentinel",
  "hhmmss",
  "semicolon-comma",
  "litres",
] as const;
export type Protocol = (typeof PROTOCOLS)[number];
export type Phase = (typeof PHASES)[number];
export type ExportStyle = (typeof EXPORTS)[number];

export interface LabCase {
  seed: number;
  protocol: Protocol;
  phase: Phase;
  style: ExportStyle;
  /** Multiplies the independent breath noise (default 1: the scatter measured in the real files). */
  noiseScale?: number;
}

/**
 * Independent breath-to-breath noise of each gas (SD, fraction), on top of the shared tidal-volume factor. Chosen so that
 * the generated breaths scatter like the three real files in test/fixtures/real-cpet: RER 1.8–3.4 % there, about 2.5 %
 * here; VE/VCO2 3.0–3.8 % there, about 3.2 % here (robust SD of each breath against the median of its 15 neighbours;
 * `npm run validate -- --noise` prints both). VE/VO2 scatters less here (about 4 %) than in the real files (4.8–6.4 %).
 */
export const BREATH_NOISE = { vo2: 0.025, vco2: 0.01, ve: 0.03 } as const;

export interface LabTruth {
  vt1Vo2MlMin: number;
  vt2Vo2MlMin: number;
  peakVo2MlMin: number;
  massKg: number;
  rampStartS: number;
  rampEndS: number;
}

function gaussian(r: () => number): number {
  const u = Math.max(r(), 1e-12),
    v = r();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}

interface Segment {
  durationS: number;
  /** Workload at a time from the segment's start: W, or km/h with a grade. */
  at: (t: number) => { w?: number; kmh?: number; grade?: number };
  ramp?: boolean;
}

/** The protocol as segments of workload over time. */
function protocolOf(c: LabCase, r: () => number) {
  const treadmill = c.protocol.startsWith("treadmill");
  const segs: Segment[] = [];
  const fit = 0.8 + 0.5 * r();
  if (!treadmill) {
    const peakW = Math.round((c.protocol === "rowing-ramp" ? 280 : 300) * fit);
    const startW = c.protocol === "rowing-ramp" ? 60 : 40 + Math.round(30 * r());
    if (c.phase === "rest-warmup-stage") {
      segs.push({ durationS: 120, at: () => ({ w: 0 }) });
      segs.push({ durationS: 180, at: () => ({ w: startW }) });
      segs.push({ durationS: 300, at: () => ({ w: Math.round(startW + 0.25 * (peakW - startW)) }) });
      segs.push({ durationS: 120, at: () => ({ w: startW }) });
    } else if (c.phase === "varied-warmup") {
      for (let k = 0; k < 5; k++) {
        const w = Math.round(startW + (0.1 + 0.4 * r()) * (peakW - startW));
        segs.push({ durationS: 60 + Math.round(60 * r()), at: () => ({ w }) });
      }
      segs.push({ durationS: 120, at: () => ({ w: startW }) });
    } else if (c.phase === "warmup") segs.push({ durationS: 180 + Math.round(120 * r()), at: () => ({ w: startW }) });
    else segs.push({ durationS: 60, at: () => ({ w: startW }) });
    if (c.protocol === "cycle-steps-1min" || c.protocol === "cycle-steps-3min") {
      const stageS = c.protocol === "cycle-steps-1min" ? 60 : 180;
      const stages = c.protocol === "cycle-steps-1min" ? 12 + Math.floor(4 * r()) : 6 + Math.floor(2 * r());
      const inc = (peakW - startW) / stages;
      segs.push({
        durationS: stages * stageS,
        ramp: true,
        at: (t) => ({ w: Math.round(startW + inc * (1 + Math.floor(t / stageS))) }),
      });
    } else {
      const rate = (15 + 20 * r()) / 60;
      segs.push({ durationS: (peakW - startW) / rate, ramp: true, at: (t) => ({ w: startW + rate * t }) });
    }
    segs.push({ durationS: 120, at: () => ({ w: 30 }) });
  } else {
    const walk = 4.5 + r();
    const runStart = 7 + 2 * r();
    const maxSpeed = runStart + 5 * fit;
    if (c.phase === "rest-warmup-stage") {
      segs.push({ durationS: 120, at: () => ({ kmh: 0, grade: 0 }) });
      segs.push({ durationS: 180, at: () => ({ kmh: walk, grade: 1 }) });
      segs.push({ durationS: 300 + Math.round(120 * r()), at: () => ({ kmh: runStart, grade: 1 }) });
    } else if (c.phase === "varied-warmup") {
      for (let k = 0; k < 5; k++) {
        const v = walk + (runStart + 2 - walk) * r();
        segs.push({ durationS: 60 + Math.round(60 * r()), at: () => ({ kmh: v, grade: 1 }) });
      }
      segs.push({ durationS: 150, at: () => ({ kmh: walk, grade: 1 }) });
    } else if (c.phase === "warmup")
      segs.push({ durationS: 180 + Math.round(120 * r()), at: () => ({ kmh: walk, grade: 1 }) });
    else segs.push({ durationS: 30, at: () => ({ kmh: walk, grade: 1 }) });
    const from = c.phase === "rest-warmup-stage" ? runStart : walk;
    if (c.protocol === "treadmill-steps") {
      // Stages of 2 min: speed up to a ceiling, then grade (a common running step protocol shape).
      const stages = 8;
      segs.push({
        durationS: stages * 120,
        ramp: true,
        at: (t) => {
          const k = 1 + Math.floor(t / 120);
          const speed = Math.min(maxSpeed, from + (k * (maxSpeed - from)) / 5);
          return { kmh: speed, grade: 1 + Math.max(0, k - 5) * 2 };
        },
      });
    } else {
      const rateKmhPerS = (0.5 + 0.5 * r()) / 60;
      const speedS = (maxSpeed - from) / rateKmhPerS;
      const gradeS = 120 + 60 * r();
      segs.push({
        durationS: speedS + gradeS,
        ramp: true,
        at: (t) =>
          t <= speedS
            ? { kmh: from + rateKmhPerS * t, grade: 1 }
            : { kmh: maxSpeed, grade: 1 + (6 * (t - speedS)) / gradeS },
      });
    }
    segs.push({ durationS: 120, at: () => ({ kmh: walk, grade: 0 }) });
  }
  return { segs, treadmill };
}

export function labTest(c: LabCase): { rows: Record<string, number | null>[]; truth: LabTruth; treadmill: boolean } {
  const r = mulberry32(
    c.seed * 7919 + PROTOCOLS.indexOf(c.protocol) * 131 + PHASES.indexOf(c.phase) * 17 + EXPORTS.indexOf(c.style),
  );
  const mass = 55 + 35 * r();
  const economy = 0.9 + 0.2 * r();
  const tau = 25 + 20 * r();
  const { segs, treadmill } = protocolOf(c, r);
  const starts: number[] = [];
  let total = 0;
  for (const s of segs) {
    starts.push(total);
    total += s.durationS;
  }
  const rampIdx = segs.findIndex((s) => s.ramp);
  const rampStartS = starts[rampIdx]!,
    rampEndS = rampStartS + segs[rampIdx]!.durationS;
  const loadAt = (t: number) => {
    let k = segs.length - 1;
    while (k > 0 && starts[k]! > t) k--;
    return segs[k]!.at(Math.min(t - starts[k]!, segs[k]!.durationS));
  };
  const vo2ss = (l: { w?: number; kmh?: number; grade?: number }) => {
    if (l.w !== undefined) return l.w <= 0 ? 3.8 * mass : 7 * mass + 1.8 * 6.12 * l.w;
    if (!l.kmh) return 3.8 * mass;
    return treadmillDemand(l.kmh, l.grade ?? 0) * mass * economy;
  };
  // Noise-free 1 Hz VO2.
  const n = Math.ceil(total) + 1;
  const vo2 = new Float64Array(n);
  let v = vo2ss(loadAt(0));
  for (let t = 0; t < n; t++) {
    v += (vo2ss(loadAt(t)) - v) * (1 - Math.exp(-1 / tau));
    vo2[t] = v;
  }
  const rampLo = vo2[Math.round(rampStartS)]!;
  let peak = 0;
  for (let t = 30; t < n; t++) {
    let s = 0;
    for (let k = t - 29; k <= t; k++) s += vo2[k]!;
    peak = Math.max(peak, s / 30);
  }
  const rampHi = peak;
  const vt1 = rampLo + (0.4 + 0.2 * r()) * (rampHi - rampLo);
  const vt2 = rampLo + (0.74 + 0.12 * r()) * (rampHi - rampLo);
  const s1 = 0.86 + 0.08 * r(),
    s2 = 1.3 + 0.2 * r();
  const restRer = 0.8 + 0.05 * r();
  const rest = 3.8 * mass;
  const co2Target = (x: number) => restRer * rest + s1 * (x - rest) + (s2 - s1) * Math.max(0, x - vt1);
  const veSlope = 0.022 + 0.008 * r(),
    veRise = 1.7 + 0.5 * r();
  const co2AtVt2 = co2Target(vt2);
  const veOf = (co2: number) => 4 + veSlope * co2 + veSlope * (veRise - 1) * Math.max(0, co2 - co2AtVt2);
  const hyper = r() < 0.3;
  const exerciseStart = starts[segs.findIndex((s) => (s.at(0).w ?? s.at(0).kmh ?? 0) > 0)] ?? 0;
  // The CO2 the body produces follows its actual metabolic rate (the VO2 of the moment, so VT1 in VO2 terms does not depend
  // on the ramp's slope: Davis et al. 1982, Med Sci Sports Exerc 14:339–343); what reaches the mouth trails it by the
  // filling of the CO2 stores, a first-order response with a time constant of 10–20 s (from memory).
  const co2StoreS = 10 + 10 * r();
  const vco2 = new Float64Array(n);
  let co2 = co2Target(vo2[0]!);
  for (let t = 0; t < n; t++) {
    co2 += (co2Target(vo2[t]!) - co2) * (1 - Math.exp(-1 / co2StoreS));
    vco2[t] = co2;
  }
  // VE answers the measured (lagged) VCO2, so on a ramp VT2 shows in VO2 terms where that VCO2 reaches its breakpoint:
  // the true VT2 is the VO2 at that moment (at steady state, the same value).
  let vt2Seen = vt2;
  for (let k = Math.round(rampStartS); k < n; k++) {
    if (vco2[k]! >= co2AtVt2) {
      vt2Seen = vo2[k]!;
      break;
    }
  }
  const noise = 0.06 + 0.03 * r();
  const scale = c.noiseScale ?? 1;
  const hrRest = 55 + 20 * r(),
    hrMax = 180 + 20 * r();
  const rowing = c.protocol === "rowing-ramp";
  const rows: Record<string, number | null>[] = [];
  let t = 0;
  while (t < total) {
    const i = Math.min(n - 1, Math.round(t));
    const frac = Math.max(0, Math.min(1, (vo2[i]! - rest) / (peak - rest)));
    const rf = 14 + 34 * frac * frac + gaussian(r);
    const common = 1 + noise * gaussian(r);
    let bVo2 = vo2[i]! * common * (1 + scale * BREATH_NOISE.vo2 * gaussian(r));
    let bVco2 = vco2[i]! * common * (1 + scale * BREATH_NOISE.vco2 * gaussian(r));
    let bVe = veOf(vco2[i]!) * common * (1 + scale * BREATH_NOISE.ve * gaussian(r));
    if (hyper && t >= exerciseStart && t < exerciseStart + 40) {
      bVco2 *= 1.3;
      bVe *= 1.5;
    }
    if (r() < 0.02) {
      const sigh = r() < 0.5;
      const g = sigh ? 1.6 : 0.35;
      bVo2 *= g;
      bVco2 *= g;
      bVe *= sigh ? 1.9 : 0.35;
    }
    const l = loadAt(t);
    const hr = hrRest + (hrMax - hrRest) * frac + 1.5 * gaussian(r);
    const power = l.w === undefined ? null : rowing && l.w > 0 ? Math.max(0, l.w * (1 + 0.15 * gaussian(r))) : l.w;
    rows.push({ t, vo2: bVo2, vco2: bVco2, ve: bVe, hr, power, kmh: l.kmh ?? null, grade: l.grade ?? null, rf });
    t += (60 / Math.max(8, rf)) * (0.8 + 0.4 * r());
  }
  return {
    rows,
    truth: { vt1Vo2MlMin: vt1, vt2Vo2MlMin: vt2Seen, peakVo2MlMin: peak, massKg: mass, rampStartS, rampEndS },
    treadmill,
  };
}

function averageRows(rows: Record<string, number | null>[], binS: number) {
  const out: Record<string, number | null>[] = [];
  let bin: Record<string, number | null>[] = [];
  let edge = binS;
  const flush = () => {
    if (!bin.length) return;
    const o: Record<string, number | null> = {};
    for (const k of Object.keys(bin[0]!)) {
      const vals = bin.map((b) => b[k]).filter((x): x is number => x !== null);
      o[k] = vals.length ? vals.reduce((a, b) => a + b, 0) / vals.length : null;
    }
    o.t = edge;
    out.push(o);
    bin = [];
  };
  for (const row of rows) {
    while (row.t! >= edge) {
      flush();
      edge += binS;
    }
    bin.push(row);
  }
  flush();
  return out;
}

const pad = (x: number) => String(x).padStart(2, "0");

/** A generated test as a lab would export it: the table (header and rows of cells) and the CSV text. */
export function labExport(c: LabCase): {
  header: string[];
  cells: (string | number)[][];
  csv: string;
  truth: LabTruth;
  massKg: number;
} {
  const { rows: raw, truth, treadmill } = labTest(c);
  const style = c.style;
  const rows =
    style === "avg-10s"
      ? averageRows(raw, 10)
      : style === "avg-15s"
        ? averageRows(raw, 15)
        : style === "avg-30s"
          ? averageRows(raw, 30)
          : raw;
  const mass = truth.massKg;
  const mph = style === "mmss-mph-sentinel" || style === "bracket-units";
  const f = (x: number | null, d: number) =>
    x === null ? "" : style === "semicolon-comma" ? x.toFixed(d).replace(".", ",") : Number(x.toFixed(d));
  const time = (s: number): string | number => {
    if (style === "minutes") return Number((s / 60).toFixed(4));
    if (style === "bracket-units") return Number((s / 60).toFixed(4));
    if (style === "mmss-mph-sentinel") return `${Math.floor(s / 60)}:${pad(Math.floor(s % 60))}`;
    if (style === "hhmmss")
      return `${pad(Math.floor(s / 3600))}:${pad(Math.floor((s % 3600) / 60))}:${pad(Math.floor(s % 60))}`;
    return f(s, 1);
  };
  let header: string[];
  let cell: (row: Record<string, number | null>) => (string | number)[];
  const load = (row: Record<string, number | null>) => {
    if (!treadmill) return [f(row.power!, 0)];
    const standing = !row.kmh;
    const speed = mph ? row.kmh! / 1.609344 : row.kmh!;
    const grade = standing && style === "mmss-mph-sentinel" ? 300.1 : row.grade!;
    return [f(speed, 1), f(grade, 1)];
  };
  const loadHeader = treadmill
    ? style === "bracket-units"
      ? ["Speed (mph)", "Grade (%)"]
      : ["speed", "grade"]
    : style === "bracket-units"
      ? ["Work (W)"]
      : ["power"];
  switch (style) {
    case "relative-first":
      header = ["time", ...loadHeader, "vo2", "vo2.1", "vco2", "ve.btps", "heartrate", "rr"];
      cell = (row) => [
        time(row.t!),
        ...load(row),
        f(row.vo2! / mass, 1),
        f(row.vo2!, 0),
        f(row.vco2!, 0),
        f(row.ve!, 1),
        f(row.hr!, 0),
        f(row.rf!, 0),
      ];
      break;
    case "repaired-names":
    case "mmss-mph-sentinel":
      header = ["Time", ...loadHeader, "VO2...4", "VO2...5", "VCO2", "RER", "VE BTPS", "HeartRate"];
      cell = (row) => [
        time(row.t!),
        ...load(row),
        f(row.vo2! / mass, 1),
        f(row.vo2!, 0),
        f(row.vco2!, 0),
        f(row.vco2! / row.vo2!, 2),
        f(row.ve!, 1),
        f(row.hr!, 0),
      ];
      break;
    case "bracket-units":
      header = ["Time (min)", ...loadHeader, "VO2 (L/min)", "VCO2 (L/min)", "VE (L/min)", "HR (bpm)"];
      cell = (row) => [
        time(row.t!),
        ...load(row),
        f(row.vo2! / 1000, 3),
        f(row.vco2! / 1000, 3),
        f(row.ve!, 1),
        f(row.hr!, 0),
      ];
      break;
    case "litres":
      header = ["t", ...loadHeader, "VO2", "VCO2", "VE", "HR"];
      cell = (row) => [
        time(row.t!),
        ...load(row),
        f(row.vo2! / 1000, 3),
        f(row.vco2! / 1000, 3),
        f(row.ve!, 1),
        f(row.hr!, 0),
      ];
      break;
    default:
      header = [
        style === "minutes" ? "time" : "time_s",
        ...loadHeader,
        "vo2_ml_min",
        "vco2_ml_min",
        "ve_l_min",
        "hr_bpm",
        "rf_per_min",
      ];
      cell = (row) => [
        time(row.t!),
        ...load(row),
        f(row.vo2!, 0),
        f(row.vco2!, 0),
        f(row.ve!, 1),
        f(row.hr!, 0),
        f(row.rf!, 0),
      ];
  }
  const cells = rows.map(cell);
  const delim = style === "semicolon-comma" ? ";" : ",";
  const csv = [header.join(delim), ...cells.map((r) => r.join(delim))].join("\n") + "\n";
  return { header, cells, csv, truth, massKg: mass };
}

/** Every combination of protocol, phase and export style, `perCell` seeds each. */
export function labCases(perCell = 1, firstSeed = 1): LabCase[] {
  const out: LabCase[] = [];
  let seed = firstSeed;
  for (const protocol of PROTOCOLS)
    for (const phase of PHASES)
      for (const style of EXPORTS) for (let k = 0; k < perCell; k++) out.push({ seed: seed++, protocol, phase, style });
  return out;
}
