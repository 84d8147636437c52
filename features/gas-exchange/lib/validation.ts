/**
 * Detection rates of the threshold engine on generated lab tests (lab-generator.ts): VT1 and VT2 within 6 % of the true
 * VO2, peak within 5 %; a missing answer counts as a miss. Shared by `npm run validate` and the unit-test subset.
 */
import { analyzeCsv } from "./analyze";
import type { Breath } from "./csv";
import { labExport, type LabCase } from "./lab-generator";

export interface CaseResult {
  c: LabCase;
  vt1: boolean;
  vt2: boolean;
  peak: boolean;
  /** A threshold placed before the ramp started (in rest, warm-up or a constant stage). */
  beforeRamp: boolean;
  /** Length of the generated ramp (or step series), in minutes. */
  rampMin: number;
  detail: string;
}

export function runCase(c: LabCase): CaseResult {
  const { csv, truth } = labExport(c);
  const a = analyzeCsv(csv);
  const rampMin = (truth.rampEndS - truth.rampStartS) / 60;
  if (!a.ok) return { c, vt1: false, vt2: false, peak: false, beforeRamp: false, rampMin, detail: a.error };
  const near = (v: number | undefined, want: number, pct: number) =>
    v !== undefined && Math.abs(v - want) <= (pct / 100) * want;
  const beforeRamp = [a.vt1, a.vt2].some((t) => t && t.timeS < truth.rampStartS);
  return {
    c,
    vt1: near(a.vt1?.vo2MlMin, truth.vt1Vo2MlMin, 6),
    vt2: near(a.vt2?.vo2MlMin, truth.vt2Vo2MlMin, 6),
    peak: near(a.peak.vo2MlMin, truth.peakVo2MlMin, 5),
    beforeRamp,
    rampMin,
    detail: `VT1 ${a.vt1?.vo2MlMin ?? a.vt1Reason} (true ${Math.round(truth.vt1Vo2MlMin)}), VT2 ${a.vt2?.vo2MlMin ?? a.vt2Reason} (true ${Math.round(truth.vt2Vo2MlMin)}), peak ${a.peak.vo2MlMin} (true ${Math.round(truth.peakVo2MlMin)}), segment ${Math.round(a.onsetS)}–${Math.round(a.endS)} s (ramp ${Math.round(truth.rampStartS)}–${Math.round(truth.rampEndS)})`,
  };
}

export interface Rates {
  n: number;
  vt1: number;
  vt2: number;
  peak: number;
  beforeRamp: number;
}

export function rates(results: CaseResult[]): Rates {
  const share = (f: (r: CaseResult) => boolean) =>
    results.length ? (100 * results.filter(f).length) / results.length : 0;
  return {
    n: results.length,
    vt1: share((r) => r.vt1),
    vt2: share((r) => r.vt2),
    peak: share((r) => r.peak),
    beforeRamp: results.filter((r) => r.beforeRamp).length,
  };
}

export function groupRates(results: CaseResult[], key: (c: LabCase) => string): [string, Rates][] {
  const groups = new Map<string, CaseResult[]>();
  for (const r of results) groups.set(key(r.c), [...(groups.get(key(r.c)) ?? []), r]);
  return [...groups].map(([k, v]) => [k, rates(v)]);
}

/** Ramp-length bands for the table: guidelines ask for ramps of about 8–12 minutes (Buchfuhrer et al. 1983). */
export function rampBand(minutes: number): string {
  if (minutes < 8) return "under 8 min";
  if (minutes < 12) return "8–12 min";
  return "12 min or longer";
}

/**
 * Breath-to-breath scatter of a file, in %: the robust SD (1.4826 × median absolute deviation) of each breath's log value
 * against the median of the 15 breaths around it, for VO2 and for the ratios RER, VE/VCO2 and VE/VO2. Used to match the
 * generator's noise to the real files (`npm run validate -- --noise`).
 */
export function breathScatter(breaths: Breath[]): { vo2: number; rer: number; veVco2: number; veVo2: number } {
  const median = (v: number[]) => {
    const s = [...v].sort((a, b) => a - b);
    return s[s.length >> 1] ?? NaN;
  };
  const kept = breaths.filter((b) => b.vo2MlMin > 0 && b.vco2MlMin > 0 && b.veLMin > 0);
  const scatter = (f: (b: Breath) => number) => {
    const v = kept.map((b) => Math.log(f(b)));
    const dev: number[] = [];
    for (let i = 7; i < v.length - 7; i++) dev.push(Math.abs(v[i]! - median(v.slice(i - 7, i + 8))));
    return Math.round(1000 * 1.4826 * median(dev)) / 10;
  };
  return {
    vo2: scatter((b) => b.vo2MlMin),
    rer: scatter((b) => b.vco2MlMin / b.vo2MlMin),
    veVco2: scatter((b) => b.veLMin / b.vco2MlMin),
    veVo2: scatter((b) => b.veLMin / b.vo2MlMin),
  };
}
