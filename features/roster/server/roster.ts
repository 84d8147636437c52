import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { anyOf, getDb, schema } from "@/db/client";
import { canViewRoster, coachedSquadIds, type Actor } from "@/features/access/lib/rules";
import { forbidden, notFound } from "@/features/platform/server/http";
import { localDate } from "@/features/platform/lib/dates";
import type { ReportLog } from "@/features/load/lib/report";
import { mondayOf } from "@/features/platform/lib/days";
import { VOLUME_HISTORY_DAYS, type SeasonWeekInfo } from "@/features/planning/lib/weeks";
import { addDays } from "@/features/platform/lib/days";
import { DEFAULT_PLANNING_RULES } from "@/features/planning/lib/rules";
import { rosterRow, type RosterRow } from "../lib/roster";
import { readinessInputs } from "@/features/athlete-tests/server";
import { EWMA_HISTORY_DAYS } from "@/features/load/lib/report";
import { unreadByAthlete } from "@/features/threads/server";

type PlannedRow = Record<string, unknown> & {
  id: string;
  athleteId: string;
  date: string;
  title: string;
  kind: string;
  totalS: number;
  minutesByZone: [number, number, number];
};
type LogRow = ReportLog &
  Record<string, unknown> & {
    athleteId: string;
    sport: string;
    hrAvgBpm: number | null;
    powerAvgW: number | null;
    speedAvgKmh: number | null;
  };

interface Athlete {
  id: string;
  name: string;
  email: string;
  sports: string[];
  timeZone: string | null;
  /** The coach's planning rules (null without a profile: the defaults). */
  maxHardDays: number | null;
  hardDaysBackToBack: boolean | null;
  volumeTolerancePct: number | null;
}

/**
 * The roster of a squad (the first coached squad when none is named). Rows come from `roster_cache` when still valid (same
 * generation, computed for the athlete's current local day); the others are computed together and stored, guarded by
 * their generation so that a change during the computation is never stored as current.
 */
export async function squadRoster(
  actor: Actor,
  squadId?: string,
  now = new Date(),
): Promise<{ squadId: string | null; rows: RosterRow[] }> {
  const id = squadId ?? coachedSquadIds(actor)[0];
  if (!id) return { squadId: null, rows: [] };
  if (!canViewRoster(actor, id)) {
    // Outside the squad its existence is not told (404, as every other route); members learn why (403).
    if (!actor.memberships.some((m) => m.squadId === id)) throw notFound("No such squad.");
    throw forbidden("Only the squad's coaches see its roster.");
  }
  const db = getDb();
  // Cache rows first exist, so that the triggers count every change from here on.
  await db.execute(sql`
    insert into roster_cache (athlete_id)
    select m.user_id from membership m where m.squad_id = ${id} and m.role = 'athlete'
      and not exists (select 1 from roster_cache c where c.athlete_id = m.user_id)
    on conflict do nothing`);
  const athletes = await db
    .select({
      id: schema.user.id,
      name: schema.user.name,
      email: schema.user.email,
      sports: sql<string[]>`coalesce(${schema.athleteProfile.sports}, '{}'::text[])`,
      timeZone: schema.athleteProfile.timeZone,
      maxHardDays: schema.athleteProfile.maxHardDays,
      hardDaysBackToBack: schema.athleteProfile.hardDaysBackToBack,
      volumeTolerancePct: schema.athleteProfile.volumeTolerancePct,
      generation: schema.rosterCache.generation,
      computedFor: schema.rosterCache.computedFor,
      // The stored row only when it is still current (same generation); whether it is for the athlete's today is
      // checked below. A stale row is not sent at all.
      row: sql<RosterRow | null>`case when ${schema.rosterCache.computedGeneration} = ${schema.rosterCache.generation} then ${schema.rosterCache.row} end`,
    })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .leftJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.user.id))
    .leftJoin(schema.rosterCache, eq(schema.rosterCache.athleteId, schema.user.id))
    .where(and(eq(schema.membership.squadId, id), eq(schema.membership.role, "athlete")))
    .orderBy(asc(schema.user.name));
  const todayIn = new Map<string, string>();
  const localToday = (tz: string | null) => {
    const zone = tz ?? "UTC";
    let d = todayIn.get(zone);
    if (!d) todayIn.set(zone, (d = localDate(now, zone)));
    return d;
  };
  const stale = athletes.filter((a) => !(a.row && a.computedFor === localToday(a.timeZone)));
  const fresh = new Map<string, RosterRow>();
  if (stale.length) {
    const computed = await computeRows(stale, localToday, now);
    const updates = stale.map((a, i) => ({
      id: a.id,
      g: a.generation ?? 0,
      day: localToday(a.timeZone),
      row: computed[i]!,
    }));
    for (const u of updates) fresh.set(u.id, u.row);
    await db.execute(sql`
      update roster_cache c set row = v.row, computed_generation = v.g, computed_for = v.day, computed_at = now()
      from json_to_recordset(${JSON.stringify(updates)}::json) as v(id text, g bigint, day text, row jsonb)
      where c.athlete_id = v.id and c.generation = v.g`);
  }
  // Unread messages are the viewer's own, so they are never part of the stored rows: one query for the squad.
  const unread = await unreadByAthlete(
    actor.userId,
    athletes.map((a) => a.id),
  );
  return {
    squadId: id,
    rows: athletes.map((a) => ({
      ...(fresh.get(a.id) ?? (a.row as unknown as RosterRow)),
      unreadMessages: unread.get(a.id) ?? 0,
    })),
  };
}

/**
 * Computes roster rows: five queries for the given athletes, run together, then the pure `rosterRow` per athlete. The
 * windows: five weeks of plan and retests back to 180 days; 181 days of logs (the load ratio; drift reads 120 of them).
 */
async function computeRows(
  athletes: Athlete[],
  localToday: (tz: string | null) => string,
  now: Date,
): Promise<RosterRow[]> {
  const db = getDb();
  const ids = athletes.map((a) => a.id);
  const today = localDate(now, "UTC");
  const monday = mondayOf(today);
  const readinessPending = readinessInputs(ids);
  const firstLogsPending = db.execute<{ athleteId: string; first: string }>(
    sql`select athlete_id as "athleteId", min(date) as first from session_log where athlete_id = ${anyOf(ids)} group by athlete_id`,
  );
  const [zoneSets, tests, sessions, logs, seasons] = await Promise.all([
    db
      .select({
        athleteId: schema.zoneSet.athleteId,
        sport: schema.zoneSet.sport,
        effectiveFrom: schema.zoneSet.effectiveFrom,
      })
      .from(schema.zoneSet)
      .where(sql`${schema.zoneSet.athleteId} = ${anyOf(ids)}`),
    db
      .select({ athleteId: schema.athleteTest.athleteId, date: schema.athleteTest.testDate })
      .from(schema.athleteTest)
      .where(sql`${schema.athleteTest.athleteId} = ${anyOf(ids)}`),
    // The two big reads skip the ORM's row mapping: plain rows, named as the pure code wants them.
    db.execute<PlannedRow>(sql`
      select p.id, p.athlete_id as "athleteId", p.date, p.title, p.kind, p.total_s as "totalS", p.minutes_by_zone as "minutesByZone"
      from planned_session p
      where p.athlete_id = ${anyOf(ids)}
        and ((p.date between ${addDays(monday, -VOLUME_HISTORY_DAYS)} and ${addDays(monday, 13)}) or (p.kind = 'retest' and p.date >= ${addDays(today, -181)}))`),
    db.execute<LogRow>(sql`
      select l.athlete_id as "athleteId", l.date, l.status, l.duration_min as "durationMin", l.rpe, l.measured_min_by_zone as "measuredMinByZone", l.trimp,
        l.planned_session_id as "plannedSessionId", l.sport, l.hr_avg_bpm as "hrAvgBpm", l.power_avg_w as "powerAvgW", l.speed_avg_kmh as "speedAvgKmh"
      from session_log l
      where l.athlete_id = ${anyOf(ids)} and l.date between ${addDays(today, -(EWMA_HISTORY_DAYS + 1))} and ${addDays(monday, 13)}`),
    db
      .select({ athleteId: schema.season.athleteId, weeks: schema.season.weeks })
      .from(schema.season)
      .where(sql`${schema.season.athleteId} = ${anyOf(ids)}`),
  ]);
  const group = <T extends { athleteId: string }>(rows: T[]) => {
    const m = new Map<string, T[]>();
    for (const r of rows) {
      const list = m.get(r.athleteId);
      if (list) list.push(r);
      else m.set(r.athleteId, [r]);
    }
    return m;
  };
  const bySets = group(zoneSets),
    byTests = group(tests),
    bySessions = group([...sessions]),
    byLogs = group([...logs]),
    bySeasons = group(seasons);
  const readinessBy = await readinessPending;
  const firstLogBy = new Map([...(await firstLogsPending)].map((r) => [r.athleteId, r.first]));
  const rows = athletes.map((a) => {
    const own = bySessions.get(a.id) ?? [];
    return rosterRow({
      athlete: { id: a.id, name: a.name, email: a.email, sports: a.sports },
      today: localToday(a.timeZone),
      zoneSets: bySets.get(a.id) ?? [],
      testDates: (byTests.get(a.id) ?? []).map((t) => t.date),
      sessions: own,
      logs: byLogs.get(a.id) ?? [],
      seasonWeeks: (bySeasons.get(a.id) ?? []).flatMap((s) => s.weeks as unknown as SeasonWeekInfo[]),
      readiness: readinessBy.get(a.id),
      firstLogDate: firstLogBy.get(a.id) ?? null,
      rules: {
        maxHardDays: a.maxHardDays ?? DEFAULT_PLANNING_RULES.maxHardDays,
        hardDaysBackToBack: a.hardDaysBackToBack ?? DEFAULT_PLANNING_RULES.hardDaysBackToBack,
        volumeTolerancePct: a.volumeTolerancePct ?? DEFAULT_PLANNING_RULES.volumeTolerancePct,
      },
    });
  });
  return rows;
}
