import "server-only";
import { and, asc, eq, gte, lte, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { addDays, mondayOf } from "@/features/platform/lib/days";
import { driftAcrossSports } from "../lib/drift";
import { ewmaStart, loadReport, type ReportLog, type ReportPlanned } from "../lib/report";

const logColumns = {
  id: schema.sessionLog.id,
  athleteId: schema.sessionLog.athleteId,
  date: schema.sessionLog.date,
  status: schema.sessionLog.status,
  durationMin: schema.sessionLog.durationMin,
  rpe: schema.sessionLog.rpe,
  measuredMinByZone: schema.sessionLog.measuredMinByZone,
  trimp: schema.sessionLog.trimp,
  trimpMethod: schema.sessionLog.trimpMethod,
  plannedSessionId: schema.sessionLog.plannedSessionId,
  sport: schema.sessionLog.sport,
  hrAvgBpm: schema.sessionLog.hrAvgBpm,
  powerAvgW: schema.sessionLog.powerAvgW,
  speedAvgKmh: schema.sessionLog.speedAvgKmh,
};
export const plannedColumns = {
  id: schema.plannedSession.id,
  athleteId: schema.plannedSession.athleteId,
  date: schema.plannedSession.date,
  title: schema.plannedSession.title,
  kind: schema.plannedSession.kind,
  totalS: schema.plannedSession.totalS,
  minutesByZone: schema.plannedSession.minutesByZone,
};
export { logColumns };

export interface LogLite extends ReportLog {
  id: string;
  athleteId: string;
  sport: string;
  hrAvgBpm: number | null;
  powerAvgW: number | null;
  speedAvgKmh: number | null;
}

export async function athleteLoad(actor: Actor, athleteId: string, from: string, to: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const db = getDb();
  // The exponentially weighted ratio starts at the athlete's first log or 180 days back (report.ts: ewmaStart).
  const [[firstLog], [profile]] = await Promise.all([
    db
      .select({ date: sql<string | null>`min(${schema.sessionLog.date})` })
      .from(schema.sessionLog)
      .where(eq(schema.sessionLog.athleteId, athleteId)),
    db
      .select({ trimpMethod: schema.athleteProfile.trimpMethod })
      .from(schema.athleteProfile)
      .where(eq(schema.athleteProfile.userId, athleteId)),
  ]);
  const firstLogDate = firstLog?.date ?? null;
  const since = [ewmaStart(firstLogDate, from), addDays(from, -28)].sort()[0]!;
  const [logs, planned] = await Promise.all([
    db
      .select(logColumns)
      .from(schema.sessionLog)
      .where(
        and(
          eq(schema.sessionLog.athleteId, athleteId),
          gte(schema.sessionLog.date, since),
          lte(schema.sessionLog.date, to),
        ),
      )
      .orderBy(asc(schema.sessionLog.date)),
    db
      .select(plannedColumns)
      .from(schema.plannedSession)
      .where(
        and(
          eq(schema.plannedSession.athleteId, athleteId),
          gte(schema.plannedSession.date, mondayOf(addDays(from, -28))),
          lte(schema.plannedSession.date, addDays(mondayOf(to), 6)),
        ),
      ),
  ]);
  return loadReport({
    logs: logs as ReportLog[],
    planned: planned as ReportPlanned[],
    from,
    to,
    firstLogDate,
    trimpMethod: profile?.trimpMethod ?? null,
  });
}

/** The athlete's zone drift as of `today` (logs of the last 120 days). */
export async function athleteDrift(actor: Actor, athleteId: string, today: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const db = getDb();
  const [logs, sets] = await Promise.all([
    db
      .select(logColumns)
      .from(schema.sessionLog)
      .where(
        and(
          eq(schema.sessionLog.athleteId, athleteId),
          gte(schema.sessionLog.date, addDays(today, -120)),
          lte(schema.sessionLog.date, today),
        ),
      ),
    db
      .select({ sport: schema.zoneSet.sport, effectiveFrom: schema.zoneSet.effectiveFrom })
      .from(schema.zoneSet)
      .where(eq(schema.zoneSet.athleteId, athleteId)),
  ]);
  return driftAcrossSports(logs, sets, today);
}
