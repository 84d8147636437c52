/**
 * A training-load report from session logs: daily session-RPE load, rolling and exponentially weighted acute:chronic ratios,
 * weekly load with monotony and strain, time per zone (measured from files where there are files, otherwise the planned
 * split scaled to the logged duration) and compliance (done minutes against planned minutes).
 */
import { acwrEwmaSeries, acwrFlag, acwrRolling, monotonyAndStrain, sessionRpeLoad } from "./load";

type Shares = [number, number, number];

export interface ReportLog {
  date: string;
  status: "done" | "partial" | "skipped";
  durationMin: number | null;
  rpe: number | null;
  measuredMinByZone: Shares | null;
  trimp: number | null;
  plannedSessionId: string | null;
}

export interface ReportPlanned {
  id: string;
  date: string;
  totalS: number;
  minutesByZone: Shares;
}

export interface DayLoad {
  date: string;
  load: number;
  acwrRolling: number | null;
  acwrEwma: number | null;
}

export interface WeekLoad {
  weekStart: string;
  load: number;
  trimp: number;
  monotony: number | null;
  strain: number | null;
  minByZone: Shares;
  /** Minutes measured from files among minByZone. */
  measuredMin: number;
  plannedMin: number;
  doneMin: number;
  /** Done ÷ planned minutes, null when nothing was planned. */
  compliance: number | null;
  sessionsPlanned: number;
  sessionsDone: number;
}

export interface LoadReport {
  days: DayLoad[];
  weeks: WeekLoad[];
  latest: { acwrRolling: number | null; acwrEwma: number | null; flag: "low" | "high" | null };
  /** Logs without an RPE (no session-RPE load): a file without a rating, say. */
  unratedLogs: number;
}

const DAY = 86_400_000;
const dayNum = (iso: string) => Math.round(Date.parse(`${iso}T00:00:00Z`) / DAY);
const isoOf = (n: number) => new Date(n * DAY).toISOString().slice(0, 10);
const mondayNum = (n: number) => n - ((new Date(n * DAY).getUTCDay() + 6) % 7);

/** Minutes per zone of a log: measured, or the planned split scaled to the logged duration, or null when unknown. */
export function logZoneMinutes(log: ReportLog, planned: ReportPlanned | undefined): Shares | null {
  if (log.status === "skipped") return [0, 0, 0];
  if (log.measuredMinByZone) return log.measuredMinByZone;
  if (planned && log.durationMin != null && planned.totalS > 0) {
    const f = log.durationMin / (planned.totalS / 60);
    return planned.minutesByZone.map((m) => m * f) as Shares;
  }
  return null;
}

/** Done minutes of a log against its planned minutes, as a fill level from 0 (capped display is the caller's). */
export function sessionCompliance(log: ReportLog | undefined, planned: ReportPlanned): number {
  if (!log || log.status === "skipped" || log.durationMin == null || planned.totalS <= 0) return 0;
  return log.durationMin / (planned.totalS / 60);
}

export function loadReport(p: { logs: ReportLog[]; planned: ReportPlanned[]; from: string; to: string }): LoadReport {
  const first = dayNum(p.from), last = dayNum(p.to);
  const origin = first - 27;
  const daily = new Array(last - origin + 1).fill(0) as number[];
  const plannedById = new Map(p.planned.map((s) => [s.id, s]));
  let unrated = 0;
  for (const l of p.logs) {
    const d = dayNum(l.date) - origin;
    if (d < 0 || d >= daily.length || l.status === "skipped") continue;
    if (l.rpe == null || l.durationMin == null) {
      unrated++;
      continue;
    }
    daily[d]! += sessionRpeLoad(l.rpe, l.durationMin);
  }
  const ewma = acwrEwmaSeries(daily);
  const days: DayLoad[] = [];
  for (let n = first; n <= last; n++) {
    const i = n - origin;
    days.push({ date: isoOf(n), load: daily[i]!, acwrRolling: acwrRolling(daily.slice(0, i + 1)), acwrEwma: ewma[i]!.ratio });
  }
  const weeks: WeekLoad[] = [];
  for (let w = mondayNum(first); w <= last; w += 7) {
    const inWeek = (iso: string) => dayNum(iso) >= w && dayNum(iso) < w + 7;
    const week = Array.from({ length: 7 }, (_, k) => (w + k - origin >= 0 && w + k - origin < daily.length ? daily[w + k - origin]! : 0));
    const ms = monotonyAndStrain(week);
    const logs = p.logs.filter((l) => inWeek(l.date));
    const planned = p.planned.filter((s) => inWeek(s.date));
    const minByZone: Shares = [0, 0, 0];
    let measured = 0, trimp = 0, doneMin = 0;
    for (const l of logs) {
      const z = logZoneMinutes(l, l.plannedSessionId ? plannedById.get(l.plannedSessionId) : undefined);
      if (z) for (let k = 0; k < 3; k++) minByZone[k]! += z[k]!;
      if (l.measuredMinByZone) measured += l.measuredMinByZone[0] + l.measuredMinByZone[1] + l.measuredMinByZone[2];
      trimp += l.trimp ?? 0;
      if (l.status !== "skipped") doneMin += l.durationMin ?? 0;
    }
    const plannedMin = planned.reduce((s, x) => s + x.totalS / 60, 0);
    const loggedIds = new Set(logs.filter((l) => l.status !== "skipped").map((l) => l.plannedSessionId));
    weeks.push({
      weekStart: isoOf(w),
      load: ms.weeklyLoad,
      trimp,
      monotony: ms.monotony,
      strain: ms.strain,
      minByZone: minByZone.map((m) => Math.round(m * 10) / 10) as Shares,
      measuredMin: Math.round(measured * 10) / 10,
      plannedMin: Math.round(plannedMin * 10) / 10,
      doneMin: Math.round(doneMin * 10) / 10,
      compliance: plannedMin > 0 ? doneMin / plannedMin : null,
      sessionsPlanned: planned.length,
      sessionsDone: planned.filter((s) => loggedIds.has(s.id)).length,
    });
  }
  const lastDay = days.at(-1);
  const latestRatio = lastDay?.acwrEwma ?? lastDay?.acwrRolling ?? null;
  return { days, weeks, latest: { acwrRolling: lastDay?.acwrRolling ?? null, acwrEwma: lastDay?.acwrEwma ?? null, flag: acwrFlag(latestRatio) }, unratedLogs: unrated };
}
