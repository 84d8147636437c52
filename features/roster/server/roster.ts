import "server-only";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { canViewRoster, coachedSquadIds, type Actor } from "@/features/access/lib/rules";
import { forbidden } from "@/features/platform/server/http";
import { localDate } from "@/features/platform/lib/dates";
import type { ReportLog } from "@/features/load/lib/report";
import { mondayOf } from "@/features/planning/lib/season";
import { addDays, type SeasonWeekInfo } from "@/features/planning/lib/weeks";
import { rosterRow, type RosterRow } from "../lib/roster";

type PlannedRow = Record<string, unknown> & { id: string; athleteId: string; date: string; title: string; kind: string; totalS: number; minutesByZone: [number, number, number] };
type LogRow = ReportLog & Record<string, unknown> & { athleteId: string; sport: string; hrAvgBpm: number | null; powerAvgW: number | null; speedAvgKmh: number | null };

/**
 * The roster of a squad (the first coached squad when none is named): five queries for the whole squad, run together, then
 * the pure `rosterRow` per athlete. The windows: five weeks of plan and retests back to 180 days; 120 days of logs (drift).
 */
export async function squadRoster(actor: Actor, squadId?: string, now = new Date()): Promise<{ squadId: string | null; rows: RosterRow[] }> {
  const id = squadId ?? coachedSquadIds(actor)[0];
  if (!id) return { squadId: null, rows: [] };
  if (!canViewRoster(actor, id)) throw forbidden("Only the squad's coaches see its roster.");
  const db = getDb();
  const athletes = await db
    .select({ id: schema.user.id, name: schema.user.name, email: schema.user.email, sports: sql<string[]>`coalesce(${schema.athleteProfile.sports}, '{}'::text[])`, timeZone: schema.athleteProfile.timeZone })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .leftJoin(schema.athleteProfile, eq(schema.athleteProfile.userId, schema.user.id))
    .where(and(eq(schema.membership.squadId, id), eq(schema.membership.role, "athlete")))
    .orderBy(asc(schema.user.name));
  if (!athletes.length) return { squadId: id, rows: [] };
  const ids = athletes.map((a) => a.id);
  const today = localDate(now, "UTC");
  const monday = mondayOf(today);
  const [zoneSets, tests, sessions, logs, seasons] = await Promise.all([
    db.select({ athleteId: schema.zoneSet.athleteId, sport: schema.zoneSet.sport, effectiveFrom: schema.zoneSet.effectiveFrom }).from(schema.zoneSet).where(inArray(schema.zoneSet.athleteId, ids)),
    db.select({ athleteId: schema.athleteTest.athleteId, date: schema.athleteTest.testDate }).from(schema.athleteTest).where(inArray(schema.athleteTest.athleteId, ids)),
    // The two big reads skip the ORM's row mapping: plain rows, named as the pure code wants them.
    db.execute<PlannedRow>(sql`
      select p.id, p.athlete_id as "athleteId", p.date, p.title, p.kind, p.total_s as "totalS", p.minutes_by_zone as "minutesByZone"
      from planned_session p join membership m on m.user_id = p.athlete_id and m.squad_id = ${id} and m.role = 'athlete'
      where (p.date between ${addDays(monday, -28)} and ${addDays(monday, 6)}) or (p.kind = 'retest' and p.date >= ${addDays(today, -180)})`),
    db.execute<LogRow>(sql`
      select l.athlete_id as "athleteId", l.date, l.status, l.duration_min as "durationMin", l.rpe, l.measured_min_by_zone as "measuredMinByZone", l.trimp,
        l.planned_session_id as "plannedSessionId", l.sport, l.hr_avg_bpm as "hrAvgBpm", l.power_avg_w as "powerAvgW", l.speed_avg_kmh as "speedAvgKmh"
      from session_log l join membership m on m.user_id = l.athlete_id and m.squad_id = ${id} and m.role = 'athlete'
      where l.date between ${addDays(today, -120)} and ${addDays(monday, 6)}`),
    db.select({ athleteId: schema.season.athleteId, weeks: schema.season.weeks }).from(schema.season).where(inArray(schema.season.athleteId, ids)),
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
  const bySets = group(zoneSets), byTests = group(tests), bySessions = group([...sessions]), byLogs = group([...logs]), bySeasons = group(seasons);
  const todayIn = new Map<string, string>();
  const localToday = (tz: string | null) => {
    if (!tz) return today;
    let d = todayIn.get(tz);
    if (!d) todayIn.set(tz, (d = localDate(now, tz)));
    return d;
  };
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
    });
  });
  return { squadId: id, rows };
}
