import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, gte, inArray, lte, sql } from "drizzle-orm";
import type { z } from "zod";
import { getDb, schema, type Database } from "@/db/client";
import { checkAthleteAccess, requireAthleteAccess, requireAthleteAccessOrNotFound } from "@/features/access/server";
import { canViewRoster, isCoachOf, type Actor } from "@/features/access/lib/rules";
import { editConflict, HttpError, notFound } from "@/features/platform/server/http";
import { localDate } from "@/features/platform/lib/dates";
import { zoneSetInForce } from "@/features/zones/lib/zones";
import { zoneSetsOf } from "@/features/zones/server";
import { logZoneMinutes } from "@/features/load/lib/report";
import { expandDates, rruleText } from "../lib/recurrence";
import { planSeason, SeasonError, type SeasonWeek } from "../lib/season";
import { mondayOf } from "@/features/platform/lib/days";
import { expand, type Block } from "../lib/session";
import { athleteMembershipsAndGeneration, cachedAnswer, storeAnswer } from "./week-cache";
import { summariseWeeks, type SeasonWeekInfo, type WeekSummary } from "../lib/weeks";
import { addDays } from "@/features/platform/lib/days";
import type { createSessionSchema, patchSessionSchema, seasonSchema, seasonWeekPatchSchema } from "../schemas";

type Tx = Pick<Database, "insert" | "update" | "select" | "delete">;

function totals(structure: Block[]) {
  const e = expand(structure);
  return { totalS: Math.round(e.totalS), minutesByZone: e.minutesByZone.map((m) => Math.round(m * 10) / 10) as [number, number, number] };
}

export async function listSessions(actor: Actor, athleteId: string, from: string, to: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const rows = await getDb()
    .select()
    .from(schema.plannedSession)
    .where(and(eq(schema.plannedSession.athleteId, athleteId), gte(schema.plannedSession.date, from), lte(schema.plannedSession.date, to)))
    .orderBy(asc(schema.plannedSession.date), asc(schema.plannedSession.createdAt));
  const series = new Map<string, string>();
  for (const r of rows) {
    if (r.seriesId && !series.has(r.seriesId)) {
      const [s] = await getDb().select().from(schema.sessionSeries).where(eq(schema.sessionSeries.id, r.seriesId));
      if (s) series.set(s.id, s.rrule);
    }
  }
  const zoneSets = await zoneSetsOf(athleteId);
  const logs = rows.length
    ? await getDb()
        .select({ id: schema.sessionLog.id, plannedSessionId: schema.sessionLog.plannedSessionId, status: schema.sessionLog.status, durationMin: schema.sessionLog.durationMin, rpe: schema.sessionLog.rpe, measuredMinByZone: schema.sessionLog.measuredMinByZone, zoneMeasure: schema.sessionLog.zoneMeasure })
        .from(schema.sessionLog)
        .where(inArray(schema.sessionLog.plannedSessionId, rows.map((r) => r.id)))
    : [];
  const logOf = new Map(logs.map((l) => [l.plannedSessionId, l]));
  return rows.map((r) => {
    const zones = zoneSetInForce(zoneSets.filter((z) => z.sport === r.sport), r.date);
    const log = logOf.get(r.id) ?? null;
    return {
      ...r,
      rrule: r.seriesId ? (series.get(r.seriesId) ?? null) : null,
      zoneSet: zones ? { id: zones.id, effectiveFrom: zones.effectiveFrom, zones: zones.zones } : null,
      log: log ? { ...log, compliance: log.status === "skipped" || log.durationMin == null || r.totalS <= 0 ? 0 : log.durationMin / (r.totalS / 60) } : null,
    };
  });
}

/** Creates a session (from a template or in full), or a weekly series of them; one transaction. */
export async function createSession(actor: Actor, athleteId: string, input: z.infer<typeof createSessionSchema>) {
  await requireAthleteAccess(actor, athleteId, "coach");
  const db = getDb();
  let base: { title: string; sport: string; kind: string; structure: Block[]; templateId: string | null; notes: string };
  if ("templateId" in input) {
    const [t] = await db.select().from(schema.sessionTemplate).where(eq(schema.sessionTemplate.id, input.templateId));
    if (!t || !isCoachOf(actor, t.squadId)) throw new HttpError(400, "Unknown template.", { fieldErrors: { templateId: ["No such template in your squads."] } });
    base = { title: t.name, sport: t.sport, kind: "training", structure: t.structure as Block[], templateId: t.id, notes: "" };
  } else {
    base = { title: input.title, sport: input.sport, kind: input.kind, structure: input.structure, templateId: null, notes: input.notes ?? "" };
  }
  const dates = input.repeat ? expandDates(input.date, input.repeat) : [input.date];
  if (!dates.length) throw new HttpError(400, "The repeat rule gives no dates.", { fieldErrors: { repeat: ["The rule gives no dates from the start date on."] } });
  const ids: string[] = [];
  await db.transaction(async (tx) => {
    let seriesId: string | null = null;
    if (input.repeat) {
      seriesId = randomUUID();
      await tx.insert(schema.sessionSeries).values({ id: seriesId, athleteId, rrule: rruleText(input.date, input.repeat) });
    }
    for (const date of dates) {
      const id = randomUUID();
      ids.push(id);
      await tx.insert(schema.plannedSession).values({ id, athleteId, date, seriesId, createdBy: actor.userId, ...base, ...totals(base.structure) });
    }
  });
  return { id: ids[0]!, ids, dates };
}

async function loadSession(actor: Actor, id: string, action: "view" | "coach") {
  const [row] = await getDb().select().from(schema.plannedSession).where(eq(schema.plannedSession.id, id));
  if (!row) throw notFound("No such session.");
  await requireAthleteAccessOrNotFound(actor, row.athleteId, "view", "No such session.");
  if (action === "coach") await requireAthleteAccess(actor, row.athleteId, "coach");
  return row;
}

/** Moves or edits a session, or its whole series from this occurrence on (scope "series"); one transaction. */
export async function updateSession(actor: Actor, id: string, patch: z.infer<typeof patchSessionSchema>) {
  const row = await loadSession(actor, id, "coach");
  const db = getDb();
  const fields = {
    ...(patch.title !== undefined ? { title: patch.title } : {}),
    ...(patch.notes !== undefined ? { notes: patch.notes } : {}),
    ...(patch.structure !== undefined ? { structure: patch.structure, ...totals(patch.structure) } : {}),
  };
  await db.transaction(async (tx: Tx) => {
    // The session as it is now, locked until the change is written: a change made on an older version is refused.
    const [current] = await tx.select().from(schema.plannedSession).where(eq(schema.plannedSession.id, id)).for("update");
    if (!current) throw notFound("No such session.");
    if (patch.version !== undefined && current.version !== patch.version) throw editConflict(current, "this session");
    const bump = { version: sql`${schema.plannedSession.version} + 1` };
    if (patch.scope === "series" && row.seriesId) {
      const shift = patch.date ? Math.round((Date.parse(patch.date) - Date.parse(row.date)) / 86_400_000) : 0;
      const members = await tx
        .select()
        .from(schema.plannedSession)
        .where(and(eq(schema.plannedSession.seriesId, row.seriesId), eq(schema.plannedSession.detached, false), gte(schema.plannedSession.date, row.date)));
      for (const m of members) {
        await tx.update(schema.plannedSession).set({ ...fields, ...bump, ...(shift ? { date: addDays(m.date, shift) } : {}) }).where(eq(schema.plannedSession.id, m.id));
      }
    } else {
      await tx
        .update(schema.plannedSession)
        .set({ ...fields, ...bump, ...(patch.date ? { date: patch.date } : {}), detached: row.seriesId ? true : row.detached })
        .where(eq(schema.plannedSession.id, id));
    }
  });
  const [updated] = await db.select().from(schema.plannedSession).where(eq(schema.plannedSession.id, id));
  return updated!;
}

export async function deleteSession(actor: Actor, id: string, scope: "one" | "series") {
  const row = await loadSession(actor, id, "coach");
  const db = getDb();
  if (scope === "series" && row.seriesId) {
    await db.delete(schema.plannedSession).where(and(eq(schema.plannedSession.seriesId, row.seriesId), gte(schema.plannedSession.date, row.date), eq(schema.plannedSession.detached, false)));
  } else {
    await db.delete(schema.plannedSession).where(eq(schema.plannedSession.id, id));
  }
}

export async function duplicateSession(actor: Actor, id: string, date: string) {
  const row = await loadSession(actor, id, "coach");
  return createSession(actor, row.athleteId, { date, title: row.title, sport: row.sport as never, kind: row.kind as "training" | "retest", structure: row.structure as Block[], notes: row.notes });
}

// ---------------------------------------------------------------------------------------------------------------------

const RETEST_STRUCTURE: Block[] = [
  { type: "step", kind: "warmup", durationS: 600, zone: 1 },
  { type: "step", kind: "work", durationS: 900, zone: 2 },
  { type: "step", kind: "cooldown", durationS: 600, zone: 1 },
];

/** Generates a season and places its retest sessions (Wednesday of each retest week); one transaction. */
export async function createSeason(actor: Actor, athleteId: string, input: z.infer<typeof seasonSchema>) {
  await requireAthleteAccess(actor, athleteId, "coach");
  let weeks;
  try {
    weeks = planSeason({ startDate: input.startDate, events: input.events, weeklyHours: input.weeklyHours, level: input.level, loadingWeeks: input.loadingWeeks, retestEveryWeeks: input.retestEveryWeeks });
  } catch (e) {
    if (e instanceof SeasonError) throw new HttpError(400, e.message);
    throw e;
  }
  const id = randomUUID();
  await getDb().transaction(async (tx) => {
    await tx.insert(schema.season).values({ id, athleteId, name: input.name, sport: input.sport, startDate: weeks[0]!.weekStart, events: input.events, weeklyHours: input.weeklyHours, level: input.level, retestEveryWeeks: input.retestEveryWeeks, weeks: weeks as unknown as Record<string, unknown>[], createdBy: actor.userId });
    for (const w of weeks.filter((x) => x.retest)) {
      await tx.insert(schema.plannedSession).values({ id: randomUUID(), athleteId, date: addDays(w.weekStart, 2), kind: "retest", sport: input.sport, title: "Retest: threshold test", structure: RETEST_STRUCTURE, ...totals(RETEST_STRUCTURE), createdBy: actor.userId, notes: "Retest to keep the zones in step with fitness. Answer the readiness questions first." });
    }
  });
  return { id, weeks };
}

/**
 * Edits one week of a season (block, role, volume target, budget, retest). Turning the retest on places a retest session on
 * the Wednesday of that week; turning it off removes the week's retest sessions that have no log. One transaction.
 */
export async function updateSeasonWeek(actor: Actor, seasonId: string, weekStart: string, patch: z.infer<typeof seasonWeekPatchSchema>) {
  const db = getDb();
  const [row] = await db.select().from(schema.season).where(eq(schema.season.id, seasonId));
  if (!row) throw notFound("No such season.");
  await requireAthleteAccessOrNotFound(actor, row.athleteId, "view", "No such season.");
  await requireAthleteAccess(actor, row.athleteId, "coach");
  const weeks = row.weeks as unknown as SeasonWeek[];
  const index = weeks.findIndex((w) => w.weekStart === weekStart);
  if (index < 0) throw new HttpError(400, `The season has no week starting ${weekStart}.`, { fieldErrors: { weekStart: ["Choose a Monday of this season."] } });
  const { version, ...changes } = patch;
  let after: SeasonWeek = { ...weeks[index]!, ...changes };
  let before: SeasonWeek = weeks[index]!;
  let nextVersion = row.version + 1;
  await db.transaction(async (tx) => {
    // The season as it is now, locked until the change is written: a change made on an older version is refused.
    const [current] = await tx.select().from(schema.season).where(eq(schema.season.id, seasonId)).for("update");
    if (!current) throw notFound("No such season.");
    if (version !== undefined && current.version !== version) throw editConflict({ id: current.id, version: current.version, weeks: current.weeks }, "this season");
    const currentWeeks = current.weeks as unknown as SeasonWeek[];
    before = currentWeeks[index]!;
    after = { ...before, ...changes };
    nextVersion = current.version + 1;
    const next = currentWeeks.map((w, i) => (i === index ? after : w));
    await tx.update(schema.season).set({ weeks: next as unknown as Record<string, unknown>[], version: nextVersion }).where(eq(schema.season.id, seasonId));
    const weekEnd = addDays(weekStart, 6);
    if (after.retest && !before.retest) {
      const existing = await tx.select({ id: schema.plannedSession.id }).from(schema.plannedSession).where(and(eq(schema.plannedSession.athleteId, row.athleteId), eq(schema.plannedSession.kind, "retest"), gte(schema.plannedSession.date, weekStart), lte(schema.plannedSession.date, weekEnd)));
      if (!existing.length) {
        await tx.insert(schema.plannedSession).values({ id: randomUUID(), athleteId: row.athleteId, date: addDays(weekStart, 2), kind: "retest", sport: row.sport, title: "Retest: threshold test", structure: RETEST_STRUCTURE, ...totals(RETEST_STRUCTURE), createdBy: actor.userId, notes: "Retest to keep the zones in step with fitness. Answer the readiness questions first." });
      }
    } else if (!after.retest && before.retest) {
      const retests = await tx.select({ id: schema.plannedSession.id }).from(schema.plannedSession).where(and(eq(schema.plannedSession.athleteId, row.athleteId), eq(schema.plannedSession.kind, "retest"), gte(schema.plannedSession.date, weekStart), lte(schema.plannedSession.date, weekEnd)));
      const logged = retests.length ? await tx.select({ id: schema.sessionLog.plannedSessionId }).from(schema.sessionLog).where(inArray(schema.sessionLog.plannedSessionId, retests.map((r) => r.id))) : [];
      const keep = new Set(logged.map((l) => l.id));
      const drop = retests.filter((r) => !keep.has(r.id)).map((r) => r.id);
      if (drop.length) await tx.delete(schema.plannedSession).where(inArray(schema.plannedSession.id, drop));
    }
  });
  return { id: seasonId, week: after, version: nextVersion };
}

export async function listSeasons(actor: Actor, athleteId: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  return getDb().select().from(schema.season).where(eq(schema.season.athleteId, athleteId)).orderBy(asc(schema.season.startDate));
}

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
export async function weekSummariesJson(actor: Actor, athleteId: string, from: string, to: string, now = new Date()): Promise<string> {
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

async function computeWeekSummaries(athleteId: string, from: string, to: string, today: string) {
  const db = getDb();
  const start = addDays(mondayOf(from), -28);
  // Two weeks beyond the range too: a proposed fix may move a session into them.
  const end = addDays(mondayOf(to), 6 + 14);
  const [sessions, seasons, tests, logs] = await Promise.all([
    db
      .select({ id: schema.plannedSession.id, date: schema.plannedSession.date, title: schema.plannedSession.title, kind: schema.plannedSession.kind, minutesByZone: schema.plannedSession.minutesByZone, totalS: schema.plannedSession.totalS })
      .from(schema.plannedSession)
      .where(and(eq(schema.plannedSession.athleteId, athleteId), gte(schema.plannedSession.date, start), lte(schema.plannedSession.date, end))),
    db.select({ weeks: schema.season.weeks }).from(schema.season).where(eq(schema.season.athleteId, athleteId)),
    db.select({ date: schema.athleteTest.testDate }).from(schema.athleteTest).where(eq(schema.athleteTest.athleteId, athleteId)),
    db
      .select({ date: schema.sessionLog.date, status: schema.sessionLog.status, durationMin: schema.sessionLog.durationMin, rpe: schema.sessionLog.rpe, measuredMinByZone: schema.sessionLog.measuredMinByZone, trimp: schema.sessionLog.trimp, plannedSessionId: schema.sessionLog.plannedSessionId })
      .from(schema.sessionLog)
      .where(and(eq(schema.sessionLog.athleteId, athleteId), gte(schema.sessionLog.date, mondayOf(from)), lte(schema.sessionLog.date, addDays(mondayOf(to), 6)))),
  ]);
  const seasonWeeks = seasons.flatMap((s) => s.weeks as unknown as SeasonWeekInfo[]);
  const plannedById = new Map(sessions.map((s) => [s.id, s]));
  const done = logs.map((l) => ({ date: l.date, minutesByZone: logZoneMinutes(l, l.plannedSessionId ? plannedById.get(l.plannedSessionId) : undefined) ?? ([0, 0, 0] as [number, number, number]) }));
  return summariseWeeks({ from, to, sessions, seasonWeeks, testDates: tests.map((t) => t.date), done, today });
}

/** The next retest session on or after a date, or null. */
export async function nextRetestOf(actor: Actor, athleteId: string, from: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const [row] = await getDb()
    .select({ id: schema.plannedSession.id, date: schema.plannedSession.date, title: schema.plannedSession.title })
    .from(schema.plannedSession)
    .where(and(eq(schema.plannedSession.athleteId, athleteId), eq(schema.plannedSession.kind, "retest"), gte(schema.plannedSession.date, from)))
    .orderBy(asc(schema.plannedSession.date))
    .limit(1);
  return row ?? null;
}

export interface SquadWeekRow {
  athlete: { id: string; name: string };
  sessions: { id: string; date: string; title: string; kind: string; totalS: number; minutesByZone: [number, number, number]; log: "done" | "partial" | "skipped" | null }[];
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
    .select({ id: schema.user.id, name: schema.user.name, timeZone: schema.athleteProfile.timeZone })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .leftJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.user.id))
    .where(and(eq(schema.membership.squadId, squadId), eq(schema.membership.role, "athlete")))
    .orderBy(asc(schema.user.name));
  const athletes = rows.map(({ id, name }) => ({ id, name }));
  const timeZoneOf = new Map(rows.map((r) => [r.id, r.timeZone ?? "UTC"]));
  if (!athletes.length) return [];
  const ids = athletes.map((a) => a.id);
  const [sessions, seasons, tests, logs] = await Promise.all([
    db
      .select({ id: schema.plannedSession.id, athleteId: schema.plannedSession.athleteId, date: schema.plannedSession.date, title: schema.plannedSession.title, kind: schema.plannedSession.kind, minutesByZone: schema.plannedSession.minutesByZone, totalS: schema.plannedSession.totalS })
      .from(schema.plannedSession)
      .where(and(inArray(schema.plannedSession.athleteId, ids), gte(schema.plannedSession.date, addDays(monday, -28)), lte(schema.plannedSession.date, sunday)))
      .orderBy(asc(schema.plannedSession.date), asc(schema.plannedSession.createdAt)),
    db.select({ athleteId: schema.season.athleteId, weeks: schema.season.weeks }).from(schema.season).where(inArray(schema.season.athleteId, ids)),
    db.select({ athleteId: schema.athleteTest.athleteId, date: schema.athleteTest.testDate }).from(schema.athleteTest).where(inArray(schema.athleteTest.athleteId, ids)),
    db
      .select({ athleteId: schema.sessionLog.athleteId, date: schema.sessionLog.date, status: schema.sessionLog.status, durationMin: schema.sessionLog.durationMin, rpe: schema.sessionLog.rpe, measuredMinByZone: schema.sessionLog.measuredMinByZone, trimp: schema.sessionLog.trimp, plannedSessionId: schema.sessionLog.plannedSessionId })
      .from(schema.sessionLog)
      .where(and(inArray(schema.sessionLog.athleteId, ids), gte(schema.sessionLog.date, monday), lte(schema.sessionLog.date, sunday))),
  ]);
  const plannedById = new Map(sessions.map((x) => [x.id, x]));
  const logOf = new Map(logs.filter((l) => l.plannedSessionId).map((l) => [l.plannedSessionId!, l.status]));
  const now = new Date();
  return athletes.map((a) => {
    const own = sessions.filter((x) => x.athleteId === a.id);
    const done = logs
      .filter((l) => l.athleteId === a.id)
      .map((l) => ({ date: l.date, minutesByZone: logZoneMinutes(l, l.plannedSessionId ? plannedById.get(l.plannedSessionId) : undefined) ?? ([0, 0, 0] as [number, number, number]) }));
    const [week] = summariseWeeks({
      from: monday,
      to: monday,
      sessions: own,
      seasonWeeks: seasons.filter((x) => x.athleteId === a.id).flatMap((x) => x.weeks as unknown as SeasonWeekInfo[]),
      testDates: tests.filter((t) => t.athleteId === a.id).map((t) => t.date),
      // The athlete's own day, as on the roster.
      today: localDate(now, timeZoneOf.get(a.id)!),
      done,
      withFix: false,
    });
    return {
      athlete: a,
      sessions: own.filter((x) => x.date >= monday).map((x) => ({ id: x.id, date: x.date, title: x.title, kind: x.kind, totalS: x.totalS, minutesByZone: x.minutesByZone, log: logOf.get(x.id) ?? null })),
      week: week!,
    };
  });
}
