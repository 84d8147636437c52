/**
 * Zone drift: heart rate at the same power (or pace) moving away from where it was when the zones were set.
 *
 * Method (our own, documented here): the sessions of the first `baselineDays` after the zone set's date form the baseline;
 * an ordinary least-squares line of average heart rate on average power (or speed) is fitted to them. Each later session
 * whose power lies within the baseline's range (±10 %) — "the same power" — is compared with the line. When at least
 * `minRecent` such sessions of the last `recentDays` differ from it by `thresholdBpm` or more on average, the zones have
 * probably drifted: a rise suggests fatigue, illness, heat or lost fitness, a fall gained fitness or overreaching. Either way an
 * earlier retest re-aligns the zones. A few beats of day-to-day variation are common, so the default threshold is 5 bpm
 * (common practice, from memory).
 */

import { dayNumber } from "@/features/platform/lib/days";

export interface DriftEntry {
  date: string;
  hrAvgBpm: number;
  /** Average power (W) or speed (km/h) of the session. */
  x: number;
}

export interface DriftOptions {
  baselineDays?: number;
  recentDays?: number;
  thresholdBpm?: number;
  minBaseline?: number;
  minRecent?: number;
}

export interface DriftResult {
  drifted: boolean;
  direction: "up" | "down" | null;
  /** Mean difference of recent heart rate from the baseline line (bpm). */
  meanDiffBpm: number;
  baselineSessions: number;
  recentSessions: number;
  /** Expected and seen heart rate at the recent sessions' mean power or speed. */
  atX: number;
  expectedHrBpm: number;
  recentHrBpm: number;
  message: string;
}

export function detectDrift(
  entries: DriftEntry[],
  zoneSetFrom: string,
  today: string,
  unit: "W" | "km/h",
  opts: DriftOptions = {},
): DriftResult | null {
  const { baselineDays = 21, recentDays = 21, thresholdBpm = 5, minBaseline = 3, minRecent = 3 } = opts;
  const start = dayNumber(zoneSetFrom),
    now = dayNumber(today);
  const baseline = entries.filter((e) => dayNumber(e.date) >= start && dayNumber(e.date) < start + baselineDays);
  if (baseline.length < minBaseline) return null;
  const xs = baseline.map((e) => e.x),
    ys = baseline.map((e) => e.hrAvgBpm);
  const mx = xs.reduce((a, b) => a + b, 0) / xs.length,
    my = ys.reduce((a, b) => a + b, 0) / ys.length;
  let sxx = 0,
    sxy = 0;
  for (let i = 0; i < xs.length; i++) {
    sxx += (xs[i]! - mx) ** 2;
    sxy += (xs[i]! - mx) * (ys[i]! - my);
  }
  // Too little spread in power to fit a slope: compare with the baseline mean (the recent sessions are at that power anyway).
  const slope = sxx > 0 && Math.sqrt(sxx / xs.length) > 0.02 * mx ? sxy / sxx : 0;
  const predict = (x: number) => my + slope * (x - mx);
  const lo = Math.min(...xs) * 0.9,
    hi = Math.max(...xs) * 1.1;
  const recent = entries.filter(
    (e) =>
      dayNumber(e.date) >= Math.max(start + baselineDays, now - recentDays) &&
      dayNumber(e.date) <= now &&
      e.x >= lo &&
      e.x <= hi,
  );
  if (recent.length < minRecent) return null;
  const diffs = recent.map((e) => e.hrAvgBpm - predict(e.x));
  const meanDiff = diffs.reduce((a, b) => a + b, 0) / diffs.length;
  const atX = recent.reduce((a, e) => a + e.x, 0) / recent.length;
  const drifted = Math.abs(meanDiff) >= thresholdBpm;
  const direction = drifted ? (meanDiff > 0 ? "up" : "down") : null;
  const expected = predict(atX);
  const seen = expected + meanDiff;
  const at = unit === "W" ? `${Math.round(atX)} W` : `${atX.toFixed(1)} km/h`;
  const message = drifted
    ? `Heart rate at ${at} is ${Math.round(seen)} bpm over the last ${recent.length} sessions, against ${Math.round(expected)} bpm when the zones were set (${meanDiff > 0 ? "+" : ""}${Math.round(meanDiff)} bpm). ${direction === "up" ? "Fatigue, illness, heat or lost fitness can do this; consider an earlier retest" : "Gained fitness can do this, and so can overreaching (heart rate that no longer rises as usual: Meeusen et al. 2013, Eur J Sport Sci 13:1–24); look at the athlete's RPE and load beside it before retesting"}.`
    : `Heart rate at the same ${unit === "W" ? "power" : "speed"} is within ${thresholdBpm} bpm of the baseline (${meanDiff > 0 ? "+" : ""}${meanDiff.toFixed(1)} bpm).`;
  return {
    drifted,
    direction,
    meanDiffBpm: meanDiff,
    baselineSessions: baseline.length,
    recentSessions: recent.length,
    atX,
    expectedHrBpm: expected,
    recentHrBpm: seen,
    message,
  };
}

export interface DriftLog {
  date: string;
  sport: string;
  hrAvgBpm: number | null;
  powerAvgW: number | null;
  speedAvgKmh: number | null;
}

/** Drift per sport since that sport's latest zone set, against power where the logs have it, else speed; a drifted one first. */
export function driftAcrossSports(
  logs: DriftLog[],
  zoneSets: { sport: string; effectiveFrom: string }[],
  today: string,
): (DriftResult & { sport: string }) | null {
  let best: (DriftResult & { sport: string }) | null = null;
  for (const sport of new Set(zoneSets.map((z) => z.sport))) {
    const from = zoneSets
      .filter((z) => z.sport === sport && z.effectiveFrom <= today)
      .map((z) => z.effectiveFrom)
      .sort()
      .at(-1);
    if (!from) continue;
    const usePower = logs.some((l) => l.sport === sport && l.powerAvgW != null);
    const entries = logs
      .filter(
        (l) => l.sport === sport && l.hrAvgBpm != null && (usePower ? l.powerAvgW != null : l.speedAvgKmh != null),
      )
      .map((l) => ({ date: l.date, hrAvgBpm: l.hrAvgBpm!, x: usePower ? l.powerAvgW! : l.speedAvgKmh! }));
    const r = detectDrift(entries, from, today, usePower ? "W" : "km/h");
    if (r && (!best || (r.drifted && !best.drifted))) best = { ...r, sport };
  }
  return best;
}
