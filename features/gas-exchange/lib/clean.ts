/**
 * Cleaning and averaging of breath-by-breath data.
 *
 * Aberrant breaths (coughs, swallows, sighs) are removed with a Hampel-type rule: each breath's VO2, VCO2 and VE are
 * compared with the running median of the surrounding breaths (11 by default, the breath itself included); the relative
 * deviations' robust spread is 1.4826 × their median absolute value over the whole test (breath noise scales with the
 * level, so relative deviations share one spread). A breath further than `k` = 4 spreads from its running median on any of
 * the three is dropped — the robust form of the "4 SD of a local mean" rule of Lamarra et al. 1987. The spread has a floor
 * of 3 %, so that very smooth (already averaged) data do not turn ordinary noise into outliers.
 */
import type { Breath } from "./csv";

export interface CleanOptions {
  windowBreaths?: number;
  k?: number;
}

/** Running median over a centred window of `2·half + 1` values (shrunk at the ends), in O(n·w) with a sorted buffer. */
export function runningMedian(values: ArrayLike<number>, half: number): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  const buf = new Float64Array(2 * half + 1);
  let size = 0;
  const position = (v: number) => {
    let lo = 0,
      hi = size;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (buf[mid]! < v) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  let left = 0,
    right = -1; // window [left, right]
  for (let i = 0; i < n; i++) {
    const wantLeft = Math.max(0, i - half),
      wantRight = Math.min(n - 1, i + half);
    while (left < wantLeft) {
      const at = position(values[left++]!);
      buf.copyWithin(at, at + 1, size);
      size--;
    }
    while (right < wantRight) {
      const v = values[++right]!;
      const at = position(v);
      buf.copyWithin(at + 1, at, size);
      buf[at] = v;
      size++;
    }
    const m = size >> 1;
    out[i] = size % 2 ? buf[m]! : (buf[m - 1]! + buf[m]!) / 2;
  }
  return out;
}

/** Median by quickselect (O(n) on average); reorders `a`. */
function medianInPlace(a: Float64Array): number {
  const kth = (k: number) => {
    let lo = 0,
      hi = a.length - 1;
    while (lo < hi) {
      const pivot = a[(lo + hi) >> 1]!;
      let i = lo,
        j = hi;
      while (i <= j) {
        while (a[i]! < pivot) i++;
        while (a[j]! > pivot) j--;
        if (i <= j) {
          const t = a[i]!;
          a[i] = a[j]!;
          a[j] = t;
          i++;
          j--;
        }
      }
      if (k <= j) hi = j;
      else if (k >= i) lo = i;
      else return a[k]!;
    }
    return a[k]!;
  };
  const m = a.length >> 1;
  return a.length % 2 ? kth(m) : (kth(m - 1) + kth(m)) / 2;
}

export function removeAberrantBreaths(breaths: Breath[], opts: CleanOptions = {}): { kept: Breath[]; removed: number } {
  const half = Math.max(2, Math.floor((opts.windowBreaths ?? 11) / 2));
  const k = opts.k ?? 4;
  const n = breaths.length;
  if (n < 2 * half + 1) return { kept: breaths, removed: 0 };
  const drop = new Uint8Array(n);
  const v = new Float64Array(n),
    abs = new Float64Array(n),
    scratch = new Float64Array(n);
  for (const key of ["vo2MlMin", "vco2MlMin", "veLMin"] as const) {
    for (let i = 0; i < n; i++) v[i] = breaths[i]![key];
    const med = runningMedian(v, half);
    for (let i = 0; i < n; i++) abs[i] = med[i]! > 0 ? Math.abs(v[i]! - med[i]!) / med[i]! : 0;
    scratch.set(abs);
    const spread = Math.max(1.4826 * medianInPlace(scratch), 0.03);
    for (let i = 0; i < n; i++) if (abs[i]! > k * spread) drop[i] = 1;
  }
  const kept = breaths.filter((_, i) => !drop[i]);
  return { kept, removed: n - kept.length };
}

export type Averaging = { mode: "time"; binS: number } | { mode: "breaths"; count: number };
// 15-s time bins: within the 10–30 s averaging common in exercise laboratories (common practice).
export const DEFAULT_AVERAGING: Averaging = { mode: "time", binS: 15 };

function averageGroup(breaths: Breath[], from: number, to: number): Breath {
  let t = 0,
    vo2 = 0,
    vco2 = 0,
    ve = 0;
  let hr = 0,
    hrN = 0,
    p = 0,
    pN = 0,
    sp = 0,
    spN = 0,
    rf = 0,
    rfN = 0,
    g = 0,
    gN = 0;
  for (let i = from; i < to; i++) {
    const b = breaths[i]!;
    t += b.timeS;
    vo2 += b.vo2MlMin;
    vco2 += b.vco2MlMin;
    ve += b.veLMin;
    if (b.hrBpm !== null) {
      hr += b.hrBpm;
      hrN++;
    }
    if (b.powerW !== null) {
      p += b.powerW;
      pN++;
    }
    if (b.speedKmh !== null) {
      sp += b.speedKmh;
      spN++;
    }
    if (b.rfPerMin !== null) {
      rf += b.rfPerMin;
      rfN++;
    }
    if (b.gradePct !== null && b.gradePct !== undefined) {
      g += b.gradePct;
      gN++;
    }
  }
  const n = to - from;
  return {
    timeS: t / n,
    vo2MlMin: vo2 / n,
    vco2MlMin: vco2 / n,
    veLMin: ve / n,
    hrBpm: hrN ? hr / hrN : null,
    powerW: pN ? p / pN : null,
    speedKmh: spN ? sp / spN : null,
    rfPerMin: rfN ? rf / rfN : null,
    gradePct: gN ? g / gN : null,
  };
}

/** Averages breaths into consecutive time bins, or a rolling mean over a number of breaths. */
export function average(breaths: Breath[], how: Averaging = DEFAULT_AVERAGING): Breath[] {
  if (!breaths.length) return [];
  if (how.mode === "time") {
    const out: Breath[] = [];
    const start = breaths[0]!.timeS;
    let from = 0;
    let bin = 0;
    for (let i = 0; i < breaths.length; i++) {
      const thisBin = Math.floor((breaths[i]!.timeS - start) / how.binS);
      if (thisBin !== bin && i > from) {
        out.push(averageGroup(breaths, from, i));
        from = i;
      }
      bin = thisBin;
    }
    if (from < breaths.length) out.push(averageGroup(breaths, from, breaths.length));
    return out;
  }
  const n = Math.max(1, Math.round(how.count));
  const out: Breath[] = [];
  for (let i = 0; i + n <= breaths.length; i++) out.push(averageGroup(breaths, i, i + n));
  return out;
}

/** Highest mean of `key` over any `windowS`-second window (time-based, two pointers, O(n)). */
export function highestWindowMean(
  breaths: Breath[],
  key: "vo2MlMin",
  windowS: number,
): { value: number; endTimeS: number } | null {
  let best: { value: number; endTimeS: number } | null = null;
  let lo = 0,
    sum = 0;
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
