/**
 * Detection rates of the threshold engine on generated lab tests (lab-generator.ts): VT1 and VT2 within 6 % of the true
 * VO2, peak within 5 %; a missing answer counts as a miss. Shared by `npm run validate` and the unit-test subset.
 */
import { analyzeCsv } from "./analyze";
import { labExport, type LabCase } from "./lab-generator";

export interface CaseResult {
  c: LabCase;
  vt1: boolean;
  vt2: boolean;
  peak: boolean;
  /** A threshold placed before the ramp started (in rest, warm-up or a constant stage). */
  beforeRamp: boolean;
  detail: string;
}

export function runCase(c: LabCase): CaseResult {
  const { csv, truth } = labExport(c);
  const a = analyzeCsv(csv);
  if (!a.ok) return { c, vt1: false, vt2: false, peak: false, beforeRamp: false, detail: a.error };
  const near = (v: number | undefined, want: number, pct: number) => v !== undefined && Math.abs(v - want) <= (pct / 100) * want;
  const beforeRamp = [a.vt1, a.vt2].some((t) => t && t.timeS < truth.rampStartS);
  return {
    c,
    vt1: near(a.vt1?.vo2MlMin, truth.vt1Vo2MlMin, 6),
    vt2: near(a.vt2?.vo2MlMin, truth.vt2Vo2MlMin, 6),
    peak: near(a.peak.vo2MlMin, truth.peakVo2MlMin, 5),
    beforeRamp,
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
  const share = (f: (r: CaseResult) => boolean) => (results.length ? (100 * results.filter(f).length) / results.length : 0);
  return { n: results.length, vt1: share((r) => r.vt1), vt2: share((r) => r.vt2), peak: share((r) => r.peak), beforeRamp: results.filter((r) => r.beforeRamp).length };
}

export function groupRates(results: CaseResult[], key: (c: LabCase) => string): [string, Rates][] {
  const groups = new Map<string, CaseResult[]>();
  for (const r of results) groups.set(key(r.c), [...(groups.get(key(r.c)) ?? []), r]);
  return [...groups].map(([k, v]) => [k, rates(v)]);
}
