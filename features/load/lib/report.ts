/**
 * A training-load report from session logs: daily session-RPE load, rolling and exponentially weighted acute:chronic ratios,
 * weekly load with monotony and strain, time per zone (measured from files where there are files, otherwise the planned
 * split scaled to the logged duration) and compliance (done minutes against planned minutes).
 */
import { dayNumber, isoOfDay } from "@/features/platform/lib/days";
import { acwrEwmaSeries, acwrFlag, acwrRolling, monotonyAndStrain, sessionRpeLoad } from "./load";

type Shares = [number, number, number];

export interface ReportLog {
  date: string;
  status: "done" | "partial" | "skipped";
  durationMin: number | null;
  rpe: number | null;
  measuredMinByZone: Shares | null;
  trimp: number | null;
  /** How `trimp` was computed; a week adds up only the athlete's own method. */
  trimpMethod?: string | null;
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
  /** The athlete's TRIMP method (weekly TRIMP adds up only logs computed with it), and how many logs had another. */
  trimpMethod: string | null;
  trimpOtherMethod: number;
}

const dayNum = dayNumber;
const isoOf = isoOfDay;
// Day 0 (1970-01-01) was a Thursday.
const mondayNum = (n: number) => n - ((((n + 3) % 7) + 7) % 7);

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

/**
 * The exponentially weighted ratio depends on where its series starts (the first day seeds both averages). So that every
 * screen shows the same value for the same day, the series starts at the athlete's first logged day, or EWMA_HISTORY_DAYS
 * before the first day asked for when the history is longer: the seed's weight in the chronic average is then
 * (1 − 2/29)^180 ≈ 3 × 10⁻⁶, below any rounding shown.
 */
export const EWMA_HISTORY_DAYS = 180;

/** The rolling ratio needs at least 21 of its 28 days to lie inside the athlete's history (common practice); before that
 * "not enough history" (one day of logs would otherwise read as a ratio of 4, flagged). */
export const MIN_HISTORY_DAYS = 21;

const enoughHistory = (day: number, firstLogDate: string | null | undefined) =>
  !!firstLogDate && day - dayNum(firstLogDate) + 1 >= MIN_HISTORY_DAYS;
/** The athlete's first logged day as given, or else the earliest of the logs passed in. */
const firstOf = (given: string | null | undefined, logs: ReportLog[]) =>
  given ?? logs.reduce<string | null>((m, l) => (m === null || l.date < m ? l.date : m), null);

/** The first day of the EWMA series for a report starting on `firstDay`, given the athlete's first logged day. */
export function ewmaStart(firstLogDate: string | null | undefined, firstDay: string): string {
  const earliest = isoOf(dayNum(firstDay) - EWMA_HISTORY_DAYS);
  if (!firstLogDate || firstLogDate < earliest) return earliest;
  return firstLogDate;
}

/** Daily session-RPE loads from `origin` (a day number) for `length` days, and the unrated count. */
function dailyLoads(logs: ReportLog[], origin: number, length: number): { daily: number[]; unrated: number } {
  const daily = new Array(length).fill(0) as number[];
  let unrated = 0;
  for (const l of logs) {
    const d = dayNum(l.date) - origin;
    if (d < 0 || d >= length || l.status === "skipped") continue;
    if (l.rpe == null || l.durationMin == null) {
      unrated++;
      continue;
    }
    daily[d]! += sessionRpeLoad(l.rpe, l.durationMin);
  }
  return { daily, unrated };
}

/** The EWMA ratio of each day from `first` to `last` (day numbers), its series starting on `start`. */
function ewmaRatios(logs: ReportLog[], start: number, first: number, last: number): (number | null)[] {
  const from = Math.min(start, first);
  const { daily } = dailyLoads(logs, from, last - from + 1);
  const series = acwrEwmaSeries(daily.slice(start - from));
  const out: (number | null)[] = [];
  for (let n = first; n <= last; n++) out.push(n < start ? null : series[n - start]!.ratio);
  return out;
}

export function loadReport(p: {
  logs: ReportLog[];
  planned: ReportPlanned[];
  from: string;
  to: string;
  firstLogDate?: string | null;
  trimpMethod?: string | null;
}): LoadReport {
  const trimpMethod = p.trimpMethod ?? null;
  let trimpOtherMethod = 0;
  const first = dayNum(p.from),
    last = dayNum(p.to);
  const firstLog = firstOf(p.firstLogDate, p.logs);
  const ewmaByDay = ewmaRatios(p.logs, dayNum(ewmaStart(firstLog, p.from)), first, last);
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
  const days: DayLoad[] = [];
  for (let n = first; n <= last; n++) {
    const i = n - origin;
    days.push({
      date: isoOf(n),
      load: daily[i]!,
      acwrRolling: enoughHistory(n, firstLog) ? acwrRolling(daily.slice(Math.max(0, i - 27), i + 1)) : null,
      acwrEwma: ewmaByDay[n - first]!,
    });
  }
  // Bucket logs and planned sessions by week once (day numbers parsed once each).
  const firstMonday = mondayNum(first);
  const weekCount = Math.floor((last - firstMonday) / 7) + 1;
  const logsByWeek: ReportLog[][] = Array.from({ length: weekCount }, () => []);
  const plannedByWeek: ReportPlanned[][] = Array.from({ length: weekCount }, () => []);
  for (const l of p.logs) {
    const k = Math.floor((dayNum(l.date) - firstMonday) / 7);
    if (k >= 0 && k < weekCount) logsByWeek[k]!.push(l);
  }
  for (const s of p.planned) {
    const k = Math.floor((dayNum(s.date) - firstMonday) / 7);
    if (k >= 0 && k < weekCount) plannedByWeek[k]!.push(s);
  }
  const weeks: WeekLoad[] = [];
  for (let k = 0; k < weekCount; k++) {
    const w = firstMonday + 7 * k;
    const week = Array.from({ length: 7 }, (_, j) =>
      w + j - origin >= 0 && w + j - origin < daily.length ? daily[w + j - origin]! : 0,
    );
    const ms = monotonyAndStrain(week);
    const logs = logsByWeek[k]!;
    const planned = plannedByWeek[k]!;
    const minByZone: Shares = [0, 0, 0];
    let measured = 0,
      trimp = 0,
      doneMin = 0;
    for (const l of logs) {
      const z = logZoneMinutes(l, l.plannedSessionId ? plannedById.get(l.plannedSessionId) : undefined);
      if (z) for (let i = 0; i < 3; i++) minByZone[i]! += z[i]!;
      if (l.measuredMinByZone) measured += l.measuredMinByZone[0] + l.measuredMinByZone[1] + l.measuredMinByZone[2];
      if (l.trimp != null) {
        // Never two scales in one sum: a log with another method (or none recorded) is left out and counted.
        if (trimpMethod && l.trimpMethod === trimpMethod) trimp += l.trimp;
        else trimpOtherMethod++;
      }
      if (l.status !== "skipped") doneMin += l.durationMin ?? 0;
    }
    const plannedMin = planned.reduce((a, x) => a + x.totalS / 60, 0);
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
      sessionsDone: planned.filter((x) => loggedIds.has(x.id)).length,
    });
  }
  const lastDay = days.at(-1);
  const latestRatio = lastDay?.acwrEwma ?? lastDay?.acwrRolling ?? null;
  return {
    days,
    weeks,
    latest: {
      acwrRolling: lastDay?.acwrRolling ?? null,
      acwrEwma: lastDay?.acwrEwma ?? null,
      flag: acwrFlag(latestRatio),
    },
    unratedLogs: unrated,
    trimpMethod,
    trimpOtherMethod,
  };
}

/**
 * Only the acute:chronic ratios of `today` — what the roster shows — without the day and week tables: the same numbers as
 * `loadReport({ from: today − 27, to: today }).latest`, for many athletes at once.
 */
export function latestLoad(logs: ReportLog[], today: string, firstLogDate?: string | null): LoadReport["latest"] {
  const last = dayNum(today),
    origin = last - 27;
  const { daily } = dailyLoads(logs, origin, 28);
  const firstLog = firstOf(firstLogDate, logs);
  const ewma = ewmaRatios(logs, dayNum(ewmaStart(firstLog, today)), last, last)[0]!;
  const rolling = enoughHistory(last, firstLog) ? acwrRolling(daily) : null;
  return { acwrRolling: rolling, acwrEwma: ewma, flag: acwrFlag(ewma ?? rolling) };
}
