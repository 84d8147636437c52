import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, gte, lte } from "drizzle-orm";
import type { z } from "zod";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess, requireAthleteAccessOrNotFound } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { HttpError, notFound } from "@/features/platform/server/http";
import { editableUntil, LOG_EDIT_DAYS } from "../lib/cr10";
import type { logSchema, patchLogSchema, unplannedLogSchema } from "../schemas";

export type LogRow = typeof schema.sessionLog.$inferSelect;

/** A log as the API and the screens get it: no client key or bookkeeping timestamps, and the end of its edit window. */
export type LogView = Omit<LogRow, "clientKey" | "createdAt" | "updatedAt"> & { editableUntil: string };

export function logView(row: LogRow): LogView {
  const { clientKey: _clientKey, createdAt, updatedAt: _updatedAt, ...rest } = row;
  void _clientKey;
  void _updatedAt;
  return { ...rest, editableUntil: editableUntil(createdAt).toISOString() };
}

function clean(input: z.infer<typeof logSchema> | z.infer<typeof patchLogSchema>) {
  const skipped = input.status === "skipped";
  return {
    ...(input.status !== undefined ? { status: input.status } : {}),
    ...(skipped
      ? { durationMin: null, distanceKm: null, rpe: null }
      : {
          ...(input.durationMin !== undefined ? { durationMin: input.durationMin } : {}),
          ...(input.distanceKm !== undefined ? { distanceKm: input.distanceKm } : {}),
          ...(input.rpe !== undefined ? { rpe: input.rpe } : {}),
        }),
    ...(input.notes !== undefined ? { notes: input.notes } : {}),
    ...(input.skipReason !== undefined || skipped ? { skipReason: skipped ? (input.skipReason ?? null) : null } : {}),
  };
}

/**
 * Logs a planned session: the athlete themself, or a coach on the athlete's behalf (the log records who). One log per planned
 * session: a repeated submit returns the existing log instead of writing a second one.
 */
export async function logPlannedSession(
  actor: Actor,
  sessionId: string,
  input: z.infer<typeof logSchema>,
): Promise<{ log: LogView; created: boolean }> {
  const db = getDb();
  const [planned] = await db.select().from(schema.plannedSession).where(eq(schema.plannedSession.id, sessionId));
  if (!planned) throw notFound("No such session.");
  await requireAthleteAccessOrNotFound(actor, planned.athleteId, "edit", "No such session.");
  const id = randomUUID();
  const inserted = await db
    .insert(schema.sessionLog)
    .values({
      id,
      athleteId: planned.athleteId,
      plannedSessionId: planned.id,
      date: planned.date,
      sport: planned.sport,
      title: planned.title,
      loggedBy: actor.userId,
      notes: "",
      ...clean(input),
      status: input.status,
    })
    .onConflictDoNothing({ target: schema.sessionLog.plannedSessionId })
    .returning();
  if (inserted[0]) return { log: logView(inserted[0]), created: true };
  const [existing] = await db
    .select()
    .from(schema.sessionLog)
    .where(eq(schema.sessionLog.plannedSessionId, planned.id));
  return { log: logView(existing!), created: false };
}

/** Logs a session that was not planned. A repeated submit with the same client key returns the first log. */
export async function logUnplannedSession(
  actor: Actor,
  athleteId: string,
  input: z.infer<typeof unplannedLogSchema>,
): Promise<{ log: LogView; created: boolean }> {
  await requireAthleteAccess(actor, athleteId, "edit");
  const db = getDb();
  const { date, sport, title, clientKey, ...rest } = input;
  const values = {
    id: randomUUID(),
    athleteId,
    date,
    sport,
    title,
    clientKey: clientKey ?? null,
    loggedBy: actor.userId,
    notes: "",
    ...clean(rest),
    status: rest.status,
  };
  const inserted = clientKey
    ? await db
        .insert(schema.sessionLog)
        .values(values)
        .onConflictDoNothing({ target: [schema.sessionLog.athleteId, schema.sessionLog.clientKey] })
        .returning()
    : await db.insert(schema.sessionLog).values(values).returning();
  if (inserted[0]) return { log: logView(inserted[0]), created: true };
  const [existing] = await db
    .select()
    .from(schema.sessionLog)
    .where(and(eq(schema.sessionLog.athleteId, athleteId), eq(schema.sessionLog.clientKey, clientKey!)));
  return { log: logView(existing!), created: false };
}

async function loadLog(actor: Actor, id: string): Promise<LogRow> {
  const [row] = await getDb().select().from(schema.sessionLog).where(eq(schema.sessionLog.id, id));
  if (!row) throw notFound("No such log.");
  await requireAthleteAccessOrNotFound(actor, row.athleteId, "edit", "No such log.");
  if (editableUntil(row.createdAt).getTime() < Date.now())
    throw new HttpError(409, `A log can be changed for ${LOG_EDIT_DAYS} days after it was made; this one is older.`);
  return row;
}

export async function updateLog(actor: Actor, id: string, patch: z.infer<typeof patchLogSchema>): Promise<LogView> {
  const row = await loadLog(actor, id);
  const merged = {
    status: patch.status ?? row.status,
    durationMin: patch.durationMin !== undefined ? patch.durationMin : row.durationMin,
    rpe: patch.rpe !== undefined ? patch.rpe : row.rpe,
    skipReason: patch.skipReason !== undefined ? patch.skipReason : row.skipReason,
  };
  if (merged.status === "skipped" && !merged.skipReason)
    throw new HttpError(400, "Some fields are not valid.", {
      fieldErrors: { skipReason: ["Say why the session was skipped (a few words are enough)."] },
    });
  if (merged.status !== "skipped" && (merged.durationMin == null || merged.rpe == null)) {
    throw new HttpError(400, "Some fields are not valid.", {
      fieldErrors: {
        ...(merged.durationMin == null ? { durationMin: ["Give how many minutes you trained."] } : {}),
        ...(merged.rpe == null ? { rpe: ["Rate the whole session from 0 (rest) to 10 (maximal)."] } : {}),
      },
    });
  }
  const [updated] = await getDb()
    .update(schema.sessionLog)
    .set({ ...clean({ ...patch, status: merged.status }), loggedBy: actor.userId })
    .where(eq(schema.sessionLog.id, id))
    .returning();
  return logView(updated!);
}

/** Undoes a log (and its activity files): the planned session is open again. */
export async function deleteLog(actor: Actor, id: string): Promise<void> {
  await loadLog(actor, id);
  await getDb().delete(schema.sessionLog).where(eq(schema.sessionLog.id, id));
}

export async function listLogs(actor: Actor, athleteId: string, from: string, to: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const db = getDb();
  const rows = await db
    .select({ log: schema.sessionLog, fileId: schema.activityFile.id, filename: schema.activityFile.filename })
    .from(schema.sessionLog)
    .leftJoin(schema.activityFile, eq(schema.activityFile.logId, schema.sessionLog.id))
    .where(
      and(
        eq(schema.sessionLog.athleteId, athleteId),
        gte(schema.sessionLog.date, from),
        lte(schema.sessionLog.date, to),
      ),
    )
    .orderBy(asc(schema.sessionLog.date), asc(schema.sessionLog.createdAt));
  const byId = new Map<string, LogView & { file: { id: string; filename: string } | null }>();
  for (const r of rows) {
    if (byId.has(r.log.id)) continue;
    byId.set(r.log.id, { ...logView(r.log), file: r.fileId ? { id: r.fileId, filename: r.filename! } : null });
  }
  return [...byId.values()];
}
