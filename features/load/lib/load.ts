/**
 * Training load. Session-RPE load, monotony and strain: Foster et al. 2001 (J Strength Cond Res 15:109–115). TRIMP: Banister
 * 1991 (sex-specific weighting) and Edwards 1993 (zones of maximal heart rate weighted 1–5). Acute:chronic workload ratio:
 * 7-day load over the 28-day average (Hulin et al. 2016) and the exponentially weighted form with λ = 2/(N+1) (Williams et
 * al. 2017); 0.8–1.3 is commonly read as the safe band (Gabbett 2016).
 */

export function sessionRpeLoad(rpe: number, minutes: number): number {
  return rpe * minutes;
}

export function banisterTrimp(p: {
  minutes: number;
  hrAvgBpm: number;
  hrRestBpm: number;
  hrMaxBpm: number;
  sex: "female" | "male";
}): number {
  const x = (p.hrAvgBpm - p.hrRestBpm) / (p.hrMaxBpm - p.hrRestBpm);
  if (!Number.isFinite(x) || x <= 0) return 0;
  const weight = p.sex === "male" ? 0.64 * Math.exp(1.92 * x) : 0.86 * Math.exp(1.67 * x);
  return p.minutes * x * weight;
}

/** Edwards TRIMP from a 1 Hz heart-rate stream (nulls are gaps). */
export function edwardsTrimp(hrBpm1Hz: (number | null)[], hrMaxBpm: number): number {
  let score = 0;
  for (const hr of hrBpm1Hz) {
    if (hr === null) continue;
    const f = hr / hrMaxBpm;
    const weight = f >= 0.9 ? 5 : f >= 0.8 ? 4 : f >= 0.7 ? 3 : f >= 0.6 ? 2 : f >= 0.5 ? 1 : 0;
    score += weight / 60;
  }
  return score;
}

/** Edwards TRIMP from minutes in the five bands 50–60, 60–70, 70–80, 80–90, 90–100 % of HRmax. */
export function edwardsTrimpFromBands(minutes: [number, number, number, number, number]): number {
  return minutes.reduce((s, m, i) => s + m * (i + 1), 0);
}

/** Rolling ACWR for the last day of `dailyLoads` (oldest first): 7-day total over the 28-day weekly average. */
export function acwrRolling(dailyLoads: number[]): number | null {
  if (dailyLoads.length < 28) return null;
  const last28 = dailyLoads.slice(-28);
  const acute = last28.slice(-7).reduce((s, v) => s + v, 0);
  const chronicWeekly = last28.reduce((s, v) => s + v, 0) / 4;
  return chronicWeekly > 0 ? acute / chronicWeekly : null;
}

/** Exponentially weighted ACWR series (Williams et al. 2017): λ = 2/(N+1), N = 7 and 28 days. */
export function acwrEwmaSeries(dailyLoads: number[]): { acute: number; chronic: number; ratio: number | null }[] {
  const la = 2 / (7 + 1),
    lc = 2 / (28 + 1);
  let acute = 0,
    chronic = 0;
  return dailyLoads.map((load, i) => {
    if (i === 0) {
      acute = load;
      chronic = load;
    } else {
      acute = load * la + (1 - la) * acute;
      chronic = load * lc + (1 - lc) * chronic;
    }
    return { acute, chronic, ratio: i >= 27 && chronic > 0 ? acute / chronic : null };
  });
}

export const ACWR_SAFE_BAND: [number, number] = [0.8, 1.3];

export function acwrFlag(ratio: number | null): "low" | "high" | null {
  if (ratio === null) return null;
  if (ratio < ACWR_SAFE_BAND[0]) return "low";
  if (ratio > ACWR_SAFE_BAND[1]) return "high";
  return null;
}

/** Monotony = mean daily load ÷ its standard deviation (population SD, 7 days incl. rest days); strain = weekly load × monotony. */
export function monotonyAndStrain(weekDailyLoads: number[]): {
  weeklyLoad: number;
  monotony: number | null;
  strain: number | null;
} {
  if (weekDailyLoads.length !== 7) throw new Error("Monotony needs the seven daily loads of a week (0 for rest days).");
  const weeklyLoad = weekDailyLoads.reduce((s, v) => s + v, 0);
  const mean = weeklyLoad / 7;
  const sd = Math.sqrt(weekDailyLoads.reduce((s, v) => s + (v - mean) ** 2, 0) / 7);
  if (sd === 0) return { weeklyLoad, monotony: null, strain: null };
  const monotony = mean / sd;
  return { weeklyLoad, monotony, strain: weeklyLoad * monotony };
}

export interface TimeInZone {
  secondsByZone: [number, number, number];
  secondsWithoutData: number;
}

/**
 * Time in zone from a 1 Hz stream (one value per second, null where the sensor gave nothing) and the VT1/VT2 bounds of the
 * measure. A value equal to VT1 counts as zone 2, equal to VT2 as zone 3.
 */
export function timeInZone(stream: (number | null)[], vt1: number, vt2: number): TimeInZone {
  const secondsByZone: [number, number, number] = [0, 0, 0];
  let gaps = 0;
  for (const v of stream) {
    if (v === null || !Number.isFinite(v)) gaps++;
    else if (v < vt1) secondsByZone[0]++;
    else if (v < vt2) secondsByZone[1]++;
    else secondsByZone[2]++;
  }
  return { secondsByZone, secondsWithoutData: gaps };
}

/** Resamples timestamped samples to 1 Hz (last value carried for up to `maxGapS` seconds; longer gaps stay null). */
export function toOneHz(samples: { timeS: number; value: number | null }[], maxGapS = 5): (number | null)[] {
  if (!samples.length) return [];
  const sorted = [...samples].sort((a, b) => a.timeS - b.timeS);
  const t0 = Math.floor(sorted[0]!.timeS);
  const out: (number | null)[] = new Array(Math.floor(sorted[sorted.length - 1]!.timeS) - t0 + 1).fill(null);
  let j = 0;
  let last: { timeS: number; value: number | null } | null = null;
  for (let s = 0; s < out.length; s++) {
    const t = t0 + s;
    while (j < sorted.length && sorted[j]!.timeS <= t) last = sorted[j++]!;
    out[s] = last && last.value !== null && t - last.timeS <= maxGapS ? last.value : null;
  }
  return out;
}
