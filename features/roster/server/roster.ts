import "server-only";
import { and, asc, eq, gte, inArray, lte, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { canViewRoster, coachedSquadIds, type Actor } from "@/features/access/lib/rules";
import { forbidden } from "@/features/platform/server/http";
import { localDate } from "@/features/platform/lib/dates";
import { logColumns, plannedColumns } from "@/features/load/server/load";
import type { ReportLog } from "@/features/load/lib/report";
import { mondayOf } from "@/features/planning/lib/season";
import { addDays, type SeasonWeekInfo } from "@/features/planning/lib/weeks";
import { rosterRow, type RosterRow } from "../lib/roster";

/** The roster of a squad (the first coached squad when none is named): a handful of queries for the whole squad. */
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
  const [zoneSets, tests, sessions, retests, logs, seasons] = await Promise.all([
    db.select({ athleteId: schema.zoneSet.athleteId, sport: schema.zoneSet.sport, effectiveFrom: schema.zoneSet.effectiveFrom }).from(schema.zoneSet).where(inArray(schema.zoneSet.athleteId, ids)),
    db.select({ athleteId: schema.athleteTest.athleteId, date: schema.athleteTest.testDate }).from(schema.athleteTest).where(inArray(schema.athleteTest.athleteId, ids)),
    db.select(plannedColumns).from(schema.plannedSession).where(and(inArray(schema.plannedSession.athleteId, ids), gte(schema.plannedSession.date, addDays(monday, -28)), lte(schema.plannedSession.date, addDays(monday, 6)))),
    db.select(plannedColumns).from(schema.plannedSession).where(and(inArray(schema.plannedSession.athleteId, ids), eq(schema.plannedSession.kind, "retest"), gte(schema.plannedSession.date, addDays(today, -180)))),
    db.select(logColumns).from(schema.sessionLog).where(and(inArray(schema.sessionLog.athleteId, ids), gte(schema.sessionLog.date, addDays(today, -120)), lte(schema.sessionLog.date, addDays(monday, 6)))),
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
  const bySets = group(zoneSets), byTests = group(tests), bySessions = group(sessions), byRetests = group(retests), byLogs = group(logs), bySeasons = group(seasons);
  const rows = athletes.map((a) => {
    const own = bySessions.get(a.id) ?? [];
    const ownIds = new Set(own.map((s) => s.id));
    const retestRows = (byRetests.get(a.id) ?? []).filter((r) => !ownIds.has(r.id));
    return rosterRow({
      athlete: { id: a.id, name: a.name, email: a.email, sports: a.sports },
      today: a.timeZone ? localDate(now, a.timeZone) : today,
      zoneSets: bySets.get(a.id) ?? [],
      testDates: (byTests.get(a.id) ?? []).map((t) => t.date),
      sessions: [...own, ...retestRows],
      logs: (byLogs.get(a.id) ?? []) as (ReportLog & (typeof logs)[number])[],
      seasonWeeks: (bySeasons.get(a.id) ?? []).flatMap((s) => s.weeks as unknown as SeasonWeekInfo[]),
    });
  });
  return { squadId: id, rows };
}
