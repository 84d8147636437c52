/**
 * Cleaning and averaging of breath-by-breath data.
 *
 * Aberrant breaths (coughs, swallows, sighs) are removed by a local robust rule: a breath is dropped when its VO2, VCO2 or
 * VE lies further than `k` robust standard deviations from the median of the surrounding breaths, the robust standard
 * deviation being 1.4826 × the median absolute deviation (Hampel filter; the "4 SD of a local mean" rule of Lamarra et al.
 * 1987 in robust form). Defaults: 11 breaths, k = 4. The spread has a floor of 3 % of the local median, so that a run of
 * near-identical breaths does not turn ordinary noise into outliers.
 */
import type { Breath } from "./csv";

export interface CleanOptions {
  windowBreaths?: number;
  k?: number;
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

export function removeAberrantBreaths(breaths: Breath[], opts: CleanOptions = {}): { kept: Breath[]; removed: number } {
  const half = Math.max(2, Math.floor((opts.windowBreaths ?? 11) / 2));
  const k = opts.k ?? 4;
  const n = breaths.length;
  if (n < 2 * half + 1) return { kept: breaths, removed: 0 };
  const keys = ["vo2MlMin", "vco2MlMin", "veLMin"] as const;
  const drop = new Uint8Array(n);
  for (const key of keys) {
    const v = breaths.map((b) => b[key]);
    for (let i = 0; i < n; i++) {
      const lo = Math.max(0, Math.min(i - half, n - 2 * half - 1));
      const window: number[] = [];
      for (let j = lo; j < lo + 2 * half + 1; j++) if (j !== i) window.push(v[j]!);
      const med = median(window);
      const mad = median(window.map((x) => Math.abs(x - med)));
      const spread = Math.max(1.4826 * mad, 0.03 * Math.abs(med));
      if (Math.abs(v[i]! - med) > k * spread) drop[i] = 1;
    }
  }
  const kept = breaths.filter((_, i) => !drop[i]);
  return { kept, removed: n - kept.length };
}

export type Averaging = { mode: "time"; binS: number } | { mode: "breaths"; count: number };
// 15-s time bins: within the 10–30 s averaging common in exercise laboratories (common practice).
export const DEFAULT_AVERAGING: Averaging = { mode: "time", binS: 15 };

function meanOrNull(values: (number | null)[]): number | null {
  let s = 0, c = 0;
  for (const v of values) {
    if (v !== null) {
      s += v;
      c++;
    }
  }
  return c ? s / c : null;
}

function averageGroup(group: Breath[]): Breath {
  const mean = (f: (b: Breath) => number) => group.reduce((s, b) => s + f(b), 0) / group.length;
  return {
    timeS: mean((b) => b.timeS),
    vo2MlMin: mean((b) => b.vo2MlMin),
    vco2MlMin: mean((b) => b.vco2MlMin),
    veLMin: mean((b) => b.veLMin),
    hrBpm: meanOrNull(group.map((b) => b.hrBpm)),
    powerW: meanOrNull(group.map((b) => b.powerW)),
    speedKmh: meanOrNull(group.map((b) => b.speedKmh)),
    rfPerMin: meanOrNull(group.map((b) => b.rfPerMin)),
  };
}

/** Averages breaths into consecutive time bins, or a rolling mean over a number of breaths. */
export function average(breaths: Breath[], how: Averaging = DEFAULT_AVERAGING): Breath[] {
  if (!breaths.length) return [];
  if (how.mode === "time") {
    const out: Breath[] = [];
    const start = breaths[0]!.timeS;
    let group: Breath[] = [];
    let bin = 0;
    for (const b of breaths) {
      const thisBin = Math.floor((b.timeS - start) / how.binS);
      if (thisBin !== bin && group.length) {
        out.push(averageGroup(group));
        group = [];
      }
      bin = thisBin;
      group.push(b);
    }
    if (group.length) out.push(averageGroup(group));
    return out;
  }
  const n = Math.max(1, Math.round(how.count));
  const out: Breath[] = [];
  for (let i = 0; i + n <= breaths.length; i++) out.push(averageGroup(breaths.slice(i, i + n)));
  return out;
}

/** Highest mean of `key` over any `windowS`-second window (time-based, two pointers, O(n)). */
export function highestWindowMean(breaths: Breath[], key: "vo2MlMin", windowS: number): { value: number; endTimeS: number } | null {
  let best: { value: number; endTimeS: number } | null = null;
  let lo = 0, sum = 0;
  for (let hi = 0; hi < breaths.length; hi++) {
    sum += breaths[hi]![key];
    while (breaths[hi]!.timeS - breaths[lo]!.timeS > windowS) {
      sum -= breaths[lo]![key];
      lo++;
    }
    const span = breaths[hi]!.timeS - breaths[lo]!.timeS;
    if (span >= windowS * 0.8) {
      const value = sum / (hi - lo + 1);
      if (!best || value > best.value) best = { value, endTimeS: breaths[hi]!.timeS };
    }
  }
  return best;
}
