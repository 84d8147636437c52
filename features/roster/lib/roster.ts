/**
 * One roster row per athlete from the rows of the whole squad: zone-set age, next retest (and whether one is overdue), this
 * week's budget state, the last four weeks' compliance, the load flag and zone drift. Pure; the server loads the rows.
 */
import { driftAcrossSports } from "@/features/load/lib/drift";
import { latestLoad, logZoneMinutes, type ReportLog, type ReportPlanned } from "@/features/load/lib/report";
import { mondayOf } from "@/features/platform/lib/days";
import type { PlanningRules } from "@/features/planning/lib/rules";
import { summariseWeeks, VOLUME_HISTORY_DAYS, type SeasonWeekInfo } from "@/features/planning/lib/weeks";
import { addDays } from "@/features/platform/lib/days";
import { readiness, type ReadinessInput, type ReadinessStatus } from "@/features/athlete-tests/lib/readiness";

/** A retest is due at the latest this long after the zones were set (common practice: 12–16 weeks). */
export const RETEST_DUE_WEEKS = 16;

export interface RosterInput {
  athlete: { id: string; name: string; email: string; sports: string[] };
  today: string;
  zoneSets: { sport: string; effectiveFrom: string }[];
  testDates: string[];
  sessions: (ReportPlanned & { title: string; kind: string })[];
  logs: (ReportLog & {
    sport: string;
    hrAvgBpm: number | null;
    powerAvgW: number | null;
    speedAvgKmh: number | null;
  })[];
  seasonWeeks: SeasonWeekInfo[];
  /** The athlete's first logged day: where the exponentially weighted load ratio starts (load/lib/report.ts). */
  firstLogDate?: string | null;
  /** The latest screening answers and the clearances (features/athlete-tests/lib/readiness.ts); absent means none. */
  readiness?: Omit<ReadinessInput, "today">;
  /** The coach's planning rules for the athlete (hard days, volume tolerance); the defaults when absent. */
  rules?: PlanningRules;
}

export interface RosterRow {
  id: string;
  name: string;
  email: string;
  sports: string[];
  zoneSetAgeDays: number | null;
  nextRetest: string | null;
  retestOverdue: boolean;
  retestNote: string | null;
  week: { overBudget: boolean; flags: string[]; plannedMin: number; doneMin: number };
  compliance4w: number | null;
  acwr: number | null;
  loadFlag: "low" | "high" | null;
  drift: { message: string; direction: "up" | "down" } | null;
  /** Readiness for testing and hard sessions: a hold, a missing or expired screening, a caution on heart rate. */
  readiness: { status: ReadinessStatus; holdHardSessions: boolean; label: string; hrMedication: boolean };
  /** Messages on the athlete's threads the viewing coach has not read (added per viewer; never stored). */
  unreadMessages?: number;
}

const days = (a: string, b: string) =>
  Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000);

export function rosterRow(input: RosterInput): RosterRow {
  const { today } = input;
  const monday = mondayOf(today);
  const latestSet = input.zoneSets
    .filter((z) => z.effectiveFrom <= today)
    .reduce<string | null>((m, z) => (m === null || z.effectiveFrom > m ? z.effectiveFrom : m), null);
  const lastTest =
    input.testDates
      .filter((d) => d <= today)
      .sort()
      .at(-1) ?? null;
  const retests = input.sessions
    .filter((s) => s.kind === "retest")
    .map((s) => s.date)
    .sort();
  const nextRetest = retests.find((d) => d >= today) ?? null;
  const missed = retests.filter((d) => d < today && !input.testDates.some((t) => t >= d)).at(-1) ?? null;
  const dueBy = latestSet ? addDays(latestSet, RETEST_DUE_WEEKS * 7) : null;
  let retestOverdue = false,
    retestNote: string | null = null;
  if (missed) {
    retestOverdue = true;
    retestNote = `The retest planned for ${missed} has no test yet.`;
  } else if (dueBy && dueBy < today && !(nextRetest && days(today, nextRetest) <= 7)) {
    retestOverdue = true;
    retestNote = `The zones are from ${latestSet}, more than ${RETEST_DUE_WEEKS} weeks ago.`;
  } else if (!latestSet) retestNote = "No zones yet: a first test is due.";

  // What was done, as the planner's weeks count it (one truth): measured minutes, or the plan's scaled to the time
  // logged; the time logged counts for volume even when its zones are not known.
  const plannedById = new Map(input.sessions.map((s) => [s.id, s]));
  const done = input.logs.map((l) => ({
    date: l.date,
    totalMin: l.status === "skipped" ? 0 : (l.durationMin ?? undefined),
    minutesByZone:
      logZoneMinutes(l, l.plannedSessionId ? plannedById.get(l.plannedSessionId) : undefined) ??
      ([0, 0, 0] as [number, number, number]),
  }));
  const [week] = summariseWeeks({
    from: monday,
    to: monday,
    sessions: input.sessions,
    seasonWeeks: input.seasonWeeks,
    testDates: lastTest ? input.testDates : [],
    today,
    done,
    doneFrom: addDays(monday, -VOLUME_HISTORY_DAYS),
    withFix: false,
    rules: input.rules,
  });
  const latest = latestLoad(input.logs, today, input.firstLogDate);
  // Compliance over the sessions planned up to today in the last four weeks.
  const from4 = addDays(monday, -21);
  const past = input.sessions.filter((s) => s.date >= from4 && s.date <= today);
  const pastIds = new Set(past.map((s) => s.id));
  const plannedMin = past.reduce((a, s) => a + s.totalS / 60, 0);
  const doneMin = input.logs
    .filter((l) => l.plannedSessionId && pastIds.has(l.plannedSessionId) && l.status !== "skipped")
    .reduce((a, l) => a + (l.durationMin ?? 0), 0);
  const weekEnd = addDays(monday, 7);
  const weekDoneMin = input.logs
    .filter((l) => l.status !== "skipped" && l.date >= monday && l.date < weekEnd)
    .reduce((a, l) => a + (l.durationMin ?? 0), 0);

  // Drift reads the last 120 days, as the athlete's page does (the logs given reach further back for the load ratio).
  const driftFrom = addDays(today, -120);
  const d = driftAcrossSports(
    input.logs.filter((l) => l.date >= driftFrom),
    input.zoneSets,
    today,
  );
  const drift: RosterRow["drift"] = d?.drifted ? { message: d.message, direction: d.direction! } : null;
  return {
    id: input.athlete.id,
    name: input.athlete.name,
    email: input.athlete.email,
    sports: input.athlete.sports,
    zoneSetAgeDays: latestSet ? days(latestSet, today) : null,
    nextRetest,
    retestOverdue,
    retestNote,
    week: {
      overBudget: week?.overBudget ?? false,
      flags: (week?.flags ?? []).map((f) => f.message),
      plannedMin: Math.round((week?.plannedMinByZone ?? [0, 0, 0]).reduce((a, b) => a + b, 0)),
      doneMin: Math.round(weekDoneMin),
    },
    compliance4w: plannedMin > 0 ? doneMin / plannedMin : null,
    acwr: latest.acwrEwma ?? latest.acwrRolling,
    loadFlag: latest.flag,
    drift,
    readiness: (({ status, holdHardSessions, label, hrMedication }) => ({
      status,
      holdHardSessions,
      label,
      hrMedication,
    }))(readiness({ ...(input.readiness ?? { latest: null, clearances: [] }), today })),
  };
}
