import "server-only";
import { and, asc, eq, gte, inArray, lte } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { checkAthleteAccess } from "@/features/access/server";
import { canViewRoster, type Actor } from "@/features/access/lib/rules";
import { HttpError } from "@/features/platform/server/http";
import { localDate } from "@/features/platform/lib/dates";
import { addDays, mondayOf } from "@/features/platform/lib/days";
import { logZoneMinutes } from "@/features/load/lib/report";
import {
  summariseWeeks,
  VOLUME_HISTORY_DAYS,
  type SeasonWeekInfo,
  type WeekSession,
  type WeekSummary,
} from "../lib/weeks";
import { DEFAULT_PLANNING_RULES, type PlanningRules } from "../lib/rules";
import type { Block } from "../lib/session";
import { athleteMembershipsAndGeneration, cachedAnswer, storeAnswer } from "./week-cache";

/** Weekly summaries against the budgets: one athlete's weeks (the planner's band) and one week of a whole squad. */

/** Per ISO week: planned minutes per zone against the budget of the season week, with flags and a fix. */
/** Week summaries of an athlete; "today" (overdue retests, the dates a fix may use) is the athlete's own day. */
export async function weekSummaries(actor: Actor, athleteId: string, from: string, to: string, now = new Date()) {
  const { today } = await viewableAthleteDay(actor, athleteId, now);
  return computeWeekSummaries(athleteId, from, to, today);
}

/**
 * `weekSummaries` as the JSON the weeks API answers with, from the per-process store of answers when nothing about the
 * athlete changed since it was computed and it is still the same day for the athlete (week-cache.ts).
 */
export async function weekSummariesJson(
  actor: Actor,
  athleteId: string,
  from: string,
  to: string,
  now = new Date(),
): Promise<string> {
  const { generation, today } = await viewableAthleteDay(actor, athleteId, now);
  if (generation === null) return JSON.stringify(await computeWeekSummaries(athleteId, from, to, today));
  const key = `${athleteId}|${from}|${to}|${today}`;
  const hit = cachedAnswer(key, generation);
  if (hit !== undefined) return hit;
  const body = JSON.stringify(await computeWeekSummaries(athleteId, from, to, today));
  storeAnswer(key, generation, body);
  return body;
}

/** The access check for viewing an athlete, with the athlete's change counter and local day, in one query. */
async function viewableAthleteDay(actor: Actor, athleteId: string, now: Date) {
  const { memberships, generation, timeZone } = await athleteMembershipsAndGeneration(athleteId);
  checkAthleteAccess(actor, { userId: athleteId, memberships }, "view");
  return { generation, today: localDate(now, timeZone ?? "UTC") };
}

type Zones = [number, number, number];

interface AthleteWeekInputs {
  sessions: (WeekSession & { totalS: number })[];
  seasonWeeks: SeasonWeekInfo[];
  testDates: string[];
  done: { date: string; minutesByZone: Zones; totalMin?: number }[];
  rules: PlanningRules;
  timeZone: string;
}

/**
 * The one loader behind the athlete's weeks and the squad week: for each athlete, their planned sessions from
 * `sessionsFrom` to `sessionsTo`, their seasons' weeks, their test dates and what they logged from `logsFrom` to `logsTo`
 * (as minutes per zone: measured, or the plan's minutes scaled to the time logged), and the coach's planning rules for
 * each. Five queries, whatever the number of athletes.
 */
async function loadWeekInputs(
  athleteIds: string[],
  range: { sessionsFrom: string; sessionsTo: string; logsFrom: string; logsTo: string },
): Promise<{ byAthlete: Map<string, AthleteWeekInputs>; logStatusOf: Map<string, "done" | "partial" | "skipped"> }> {
  const db = getDb();
  const [sessions, seasons, tests, logs, profiles] = await Promise.all([
    db
      .select({
        id: schema.plannedSession.id,
        athleteId: schema.plannedSession.athleteId,
        date: schema.plannedSession.date,
        title: schema.plannedSession.title,
        kind: schema.plannedSession.kind,
        sport: schema.plannedSession.sport,
        minutesByZone: schema.plannedSession.minutesByZone,
        totalS: schema.plannedSession.totalS,
        structure: schema.plannedSession.structure,
      })
      .from(schema.plannedSession)
      .where(
        and(
          inArray(schema.plannedSession.athleteId, athleteIds),
          gte(schema.plannedSession.date, range.sessionsFrom),
          lte(schema.plannedSession.date, range.sessionsTo),
        ),
      )
      .orderBy(asc(schema.plannedSession.date), asc(schema.plannedSession.createdAt)),
    db
      .select({ athleteId: schema.season.athleteId, weeks: schema.season.weeks })
      .from(schema.season)
      .where(inArray(schema.season.athleteId, athleteIds)),
    db
      .select({ athleteId: schema.athleteTest.athleteId, date: schema.athleteTest.testDate })
      .from(schema.athleteTest)
      .where(inArray(schema.athleteTest.athleteId, athleteIds)),
    db
      .select({
        athleteId: schema.sessionLog.athleteId,
        date: schema.sessionLog.date,
        status: schema.sessionLog.status,
        durationMin: schema.sessionLog.durationMin,
        rpe: schema.sessionLog.rpe,
        measuredMinByZone: schema.sessionLog.measuredMinByZone,
        trimp: schema.sessionLog.trimp,
        plannedSessionId: schema.sessionLog.plannedSessionId,
      })
      .from(schema.sessionLog)
      .where(
        and(
          inArray(schema.sessionLog.athleteId, athleteIds),
          gte(schema.sessionLog.date, range.logsFrom),
          lte(schema.sessionLog.date, range.logsTo),
        ),
      ),
    db
      .select({
        athleteId: schema.athleteProfile.userId,
        maxHardDays: schema.athleteProfile.maxHardDays,
        hardDaysBackToBack: schema.athleteProfile.hardDaysBackToBack,
        volumeTolerancePct: schema.athleteProfile.volumeTolerancePct,
        timeZone: schema.athleteProfile.timeZone,
      })
      .from(schema.athleteProfile)
      .where(inArray(schema.athleteProfile.userId, athleteIds)),
  ]);
  const out = new Map<string, AthleteWeekInputs>(
    athleteIds.map((id) => [
      id,
      { sessions: [], seasonWeeks: [], testDates: [], done: [], rules: DEFAULT_PLANNING_RULES, timeZone: "UTC" },
    ]),
  );
  for (const { athleteId, timeZone, ...rules } of profiles) {
    const own = out.get(athleteId);
    if (own) {
      own.rules = rules;
      own.timeZone = timeZone;
    }
  }
  const plannedById = new Map(sessions.map((x) => [x.id, x]));
  for (const x of sessions) out.get(x.athleteId)?.sessions.push({ ...x, structure: x.structure as Block[] });
  for (const x of seasons) out.get(x.athleteId)?.seasonWeeks.push(...(x.weeks as unknown as SeasonWeekInfo[]));
  for (const t of tests) out.get(t.athleteId)?.testDates.push(t.date);
  for (const l of logs) {
    out.get(l.athleteId)?.done.push({
      date: l.date,
      totalMin: l.status === "skipped" ? 0 : (l.durationMin ?? undefined),
      minutesByZone:
        logZoneMinutes(l, l.plannedSessionId ? plannedById.get(l.plannedSessionId) : undefined) ?? ([0, 0, 0] as Zones),
    });
  }
  const logStatusOf = new Map(logs.filter((l) => l.plannedSessionId).map((l) => [l.plannedSessionId!, l.status]));
  return { byAthlete: out, logStatusOf };
}

async function computeWeekSummaries(athleteId: string, from: string, to: string, today: string) {
  // Four weeks before the range (the volume ramp compares with them) and two beyond it (a fix may move a session there).
  const inputs = await loadWeekInputs([athleteId], {
    sessionsFrom: addDays(mondayOf(from), -VOLUME_HISTORY_DAYS),
    sessionsTo: addDays(mondayOf(to), 6 + 14),
    logsFrom: addDays(mondayOf(from), -VOLUME_HISTORY_DAYS),
    logsTo: addDays(mondayOf(to), 6),
  });
  const mine = inputs.byAthlete.get(athleteId)!;
  // The library a swap may draw on: the templates of the athlete's squads (a change to them bumps the athlete's change
  // counter, migration 0014, so a stored answer never names a changed template).
  const templates = await getDb()
    .select({
      id: schema.sessionTemplate.id,
      name: schema.sessionTemplate.name,
      sport: schema.sessionTemplate.sport,
      totalS: schema.sessionTemplate.totalS,
      minutesByZone: schema.sessionTemplate.minutesByZone,
    })
    .from(schema.sessionTemplate)
    .innerJoin(
      schema.membership,
      and(eq(schema.membership.squadId, schema.sessionTemplate.squadId), eq(schema.membership.role, "athlete")),
    )
    .where(eq(schema.membership.userId, athleteId));
  return summariseWeeks({
    from,
    to,
    templates: templates.map((t) => ({ ...t, minutesByZone: t.minutesByZone as [number, number, number] })),
    sessions: mine.sessions,
    seasonWeeks: mine.seasonWeeks,
    testDates: mine.testDates,
    done: mine.done,
    doneFrom: addDays(mondayOf(from), -VOLUME_HISTORY_DAYS),
    today,
    rules: mine.rules,
  });
}

export interface SquadWeekRow {
  athlete: { id: string; name: string; sports: string[] };
  sessions: {
    id: string;
    date: string;
    title: string;
    kind: string;
    totalS: number;
    minutesByZone: [number, number, number];
    log: "done" | "partial" | "skipped" | null;
  }[];
  week: WeekSummary;
}

/** One ISO week for every athlete of a squad: their sessions day by day and the week's budget state. Coaches only. */
export async function squadWeek(actor: Actor, squadId: string, weekStart: string): Promise<SquadWeekRow[]> {
  if (!canViewRoster(actor, squadId)) {
    if (!actor.memberships.some((m) => m.squadId === squadId)) throw new HttpError(404, "No such squad.");
    throw new HttpError(403, "Only the squad's coaches see its week.");
  }
  const db = getDb();
  const monday = mondayOf(weekStart);
  const sunday = addDays(monday, 6);
  const rows = await db
    .select({
      id: schema.user.id,
      name: schema.user.name,
      timeZone: schema.athleteProfile.timeZone,
      sports: schema.athleteProfile.sports,
    })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .leftJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.user.id))
    .where(and(eq(schema.membership.squadId, squadId), eq(schema.membership.role, "athlete")))
    .orderBy(asc(schema.user.name));
  const athletes = rows.map(({ id, name, sports }) => ({ id, name, sports: sports ?? [] }));
  const timeZoneOf = new Map(rows.map((r) => [r.id, r.timeZone ?? "UTC"]));
  if (!athletes.length) return [];
  const { byAthlete, logStatusOf } = await loadWeekInputs(
    athletes.map((a) => a.id),
    {
      sessionsFrom: addDays(monday, -VOLUME_HISTORY_DAYS),
      sessionsTo: sunday,
      logsFrom: addDays(monday, -VOLUME_HISTORY_DAYS),
      logsTo: sunday,
    },
  );
  const now = new Date();
  return athletes.map((a) => {
    const own = byAthlete.get(a.id)!;
    const [week] = summariseWeeks({
      from: monday,
      to: monday,
      sessions: own.sessions,
      seasonWeeks: own.seasonWeeks,
      testDates: own.testDates,
      // The athlete's own day, as on the roster.
      today: localDate(now, timeZoneOf.get(a.id)!),
      done: own.done,
      doneFrom: addDays(monday, -VOLUME_HISTORY_DAYS),
      withFix: false,
      rules: own.rules,
    });
    return {
      athlete: a,
      sessions: own.sessions
        .filter((x) => x.date >= monday)
        .map((x) => ({
          id: x.id,
          date: x.date,
          title: x.title,
          kind: x.kind,
          totalS: x.totalS,
          minutesByZone: x.minutesByZone,
          log: logStatusOf.get(x.id) ?? null,
        })),
      week: week!,
    };
  });
}

/**
 * Each athlete's week as it is and as it would be with `additions` (sessions not yet written), for a preview before a
 * squad-wide action: the same loader and engine as the band, every athlete judged on their own day and rules.
 */
export async function weeksWithAdditions(
  athleteIds: string[],
  additions: Map<string, WeekSession[]>,
  now = new Date(),
): Promise<Map<string, { weekStart: string; before: WeekSummary; after: WeekSummary }[]>> {
  const weeksOf = (id: string) => [...new Set((additions.get(id) ?? []).map((s) => mondayOf(s.date)))].sort();
  const all = athleteIds.flatMap(weeksOf);
  const out = new Map<string, { weekStart: string; before: WeekSummary; after: WeekSummary }[]>();
  if (!all.length) return out;
  const first = all.reduce((a, b) => (a < b ? a : b)),
    last = all.reduce((a, b) => (a > b ? a : b));
  const { byAthlete } = await loadWeekInputs(athleteIds, {
    sessionsFrom: addDays(first, -VOLUME_HISTORY_DAYS),
    sessionsTo: addDays(last, 6),
    logsFrom: addDays(first, -VOLUME_HISTORY_DAYS),
    logsTo: addDays(last, 6),
  });
  for (const id of athleteIds) {
    const own = byAthlete.get(id)!;
    const today = localDate(now, own.timeZone);
    const judge = (sessions: WeekSession[], week: string) =>
      summariseWeeks({
        from: week,
        to: week,
        sessions,
        seasonWeeks: own.seasonWeeks,
        testDates: own.testDates,
        today,
        done: own.done,
        doneFrom: addDays(week, -VOLUME_HISTORY_DAYS),
        withFix: false,
        rules: own.rules,
      })[0]!;
    const withNew = [...own.sessions, ...(additions.get(id) ?? [])];
    out.set(
      id,
      weeksOf(id).map((w) => ({ weekStart: w, before: judge(own.sessions, w), after: judge(withNew, w) })),
    );
  }
  return out;
}
