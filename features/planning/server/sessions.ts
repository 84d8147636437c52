import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, gte, inArray, lte, sql } from "drizzle-orm";
import type { z } from "zod";
import { getDb, schema, type Database } from "@/db/client";
import { requireAthleteAccess, requireAthleteActionHiddenOtherwise } from "@/features/access/server";
import { isCoachOf, type Actor } from "@/features/access/lib/rules";
import { editConflict, HttpError, notFound } from "@/features/platform/server/http";
import { addDays } from "@/features/platform/lib/days";
import { zonesForSession } from "@/features/zones/lib/zones";
import { zoneSetsOf } from "@/features/zones/server";
import { expandDates, rruleText } from "../lib/recurrence";
import { storedTotals, type Block } from "../lib/session";
import type { createSessionSchema, patchSessionSchema } from "../schemas";
import { plannedSessionView } from "../lib/views";

/** Planned sessions: list, create (one or a weekly series), move and edit, delete, copy; the next retest. */

type Tx = Pick<Database, "insert" | "update" | "select" | "delete">;

export async function listSessions(actor: Actor, athleteId: string, from: string, to: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const rows = await getDb()
    .select()
    .from(schema.plannedSession)
    .where(
      and(
        eq(schema.plannedSession.athleteId, athleteId),
        gte(schema.plannedSession.date, from),
        lte(schema.plannedSession.date, to),
      ),
    )
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
        .select({
          id: schema.sessionLog.id,
          plannedSessionId: schema.sessionLog.plannedSessionId,
          status: schema.sessionLog.status,
          durationMin: schema.sessionLog.durationMin,
          rpe: schema.sessionLog.rpe,
          measuredMinByZone: schema.sessionLog.measuredMinByZone,
          zoneMeasure: schema.sessionLog.zoneMeasure,
        })
        .from(schema.sessionLog)
        .where(
          inArray(
            schema.sessionLog.plannedSessionId,
            rows.map((r) => r.id),
          ),
        )
    : [];
  const logOf = new Map(logs.map((l) => [l.plannedSessionId, l]));
  return rows.map((r) => {
    const found = zonesForSession(zoneSets, r.sport, r.date);
    const zones = found?.set;
    const log = logOf.get(r.id) ?? null;
    return {
      ...plannedSessionView(r),
      rrule: r.seriesId ? (series.get(r.seriesId) ?? null) : null,
      zoneSet: zones
        ? { id: zones.id, effectiveFrom: zones.effectiveFrom, zones: zones.zones, fromSport: found!.fromSport }
        : null,
      log: log
        ? {
            ...log,
            compliance:
              log.status === "skipped" || log.durationMin == null || r.totalS <= 0
                ? 0
                : log.durationMin / (r.totalS / 60),
          }
        : null,
    };
  });
}

/** Creates a session (from a template or in full), or a weekly series of them; one transaction. */
export async function createSession(actor: Actor, athleteId: string, input: z.infer<typeof createSessionSchema>) {
  await requireAthleteAccess(actor, athleteId, "coach");
  const db = getDb();
  let base: {
    title: string;
    sport: string;
    kind: string;
    structure: Block[];
    templateId: string | null;
    notes: string;
  };
  if ("templateId" in input) {
    const [t] = await db.select().from(schema.sessionTemplate).where(eq(schema.sessionTemplate.id, input.templateId));
    if (!t || !isCoachOf(actor, t.squadId))
      throw new HttpError(400, "Unknown template.", {
        fieldErrors: { templateId: ["No such template in your squads."] },
      });
    base = {
      title: t.name,
      sport: t.sport,
      kind: "training",
      structure: t.structure as Block[],
      templateId: t.id,
      notes: "",
    };
  } else {
    base = {
      title: input.title,
      sport: input.sport,
      kind: input.kind,
      structure: input.structure,
      templateId: null,
      notes: input.notes ?? "",
    };
  }
  const dates = input.repeat ? expandDates(input.date, input.repeat) : [input.date];
  if (!dates.length)
    throw new HttpError(400, "The repeat rule gives no dates.", {
      fieldErrors: { repeat: ["The rule gives no dates from the start date on."] },
    });
  const ids: string[] = [];
  await db.transaction(async (tx) => {
    let seriesId: string | null = null;
    if (input.repeat) {
      seriesId = randomUUID();
      await tx
        .insert(schema.sessionSeries)
        .values({ id: seriesId, athleteId, rrule: rruleText(input.date, input.repeat) });
    }
    for (const date of dates) {
      const id = randomUUID();
      ids.push(id);
      await tx
        .insert(schema.plannedSession)
        .values({ id, athleteId, date, seriesId, createdBy: actor.userId, ...base, ...storedTotals(base.structure) });
    }
  });
  return { id: ids[0]!, ids, dates };
}

async function loadSession(actor: Actor, id: string, action: "view" | "coach") {
  const [row] = await getDb().select().from(schema.plannedSession).where(eq(schema.plannedSession.id, id));
  if (!row) throw notFound("No such session.");
  await requireAthleteActionHiddenOtherwise(actor, row.athleteId, action, "No such session.");
  return row;
}

/**
 * One session with the zones its targets come from (the sport's set in force on its day, or the nearest sport's heart
 * rate; null without zones), for the athlete and their coaches; 404 for everyone else.
 */
export async function sessionWithZones(actor: Actor, id: string) {
  const row = await loadSession(actor, id, "view");
  const found = zonesForSession(await zoneSetsOf(row.athleteId), row.sport, row.date);
  return {
    session: plannedSessionView(row),
    zones: found?.set.zones ?? null,
    zonesFromSport: found?.fromSport ?? null,
  };
}

/** Moves or edits a session, or its whole series from this occurrence on (scope "series"); one transaction. */
export async function updateSession(actor: Actor, id: string, patch: z.infer<typeof patchSessionSchema>) {
  const row = await loadSession(actor, id, "coach");
  const db = getDb();
  const fields = {
    ...(patch.title !== undefined ? { title: patch.title } : {}),
    ...(patch.notes !== undefined ? { notes: patch.notes } : {}),
    ...(patch.structure !== undefined ? { structure: patch.structure, ...storedTotals(patch.structure) } : {}),
  };
  const updated = await db.transaction(async (tx: Tx) => {
    // The session as it is now, locked until the change is written: a change made on an older version is refused.
    const [current] = await tx
      .select()
      .from(schema.plannedSession)
      .where(eq(schema.plannedSession.id, id))
      .for("update");
    if (!current) throw notFound("No such session.");
    if (patch.version !== undefined && current.version !== patch.version)
      throw editConflict(plannedSessionView(current), "this session");
    const bump = { version: sql`${schema.plannedSession.version} + 1` };
    if (patch.scope === "series" && row.seriesId) {
      const shift = patch.date ? Math.round((Date.parse(patch.date) - Date.parse(row.date)) / 86_400_000) : 0;
      const members = await tx
        .select()
        .from(schema.plannedSession)
        .where(
          and(
            eq(schema.plannedSession.seriesId, row.seriesId),
            eq(schema.plannedSession.detached, false),
            gte(schema.plannedSession.date, row.date),
          ),
        );
      for (const m of members) {
        await tx
          .update(schema.plannedSession)
          .set({ ...fields, ...bump, ...(shift ? { date: addDays(m.date, shift) } : {}) })
          .where(eq(schema.plannedSession.id, m.id));
      }
      const [after] = await tx.select().from(schema.plannedSession).where(eq(schema.plannedSession.id, id));
      return after;
    } else {
      // The row as written comes back with the update: no second read after the transaction.
      const [after] = await tx
        .update(schema.plannedSession)
        .set({
          ...fields,
          ...bump,
          ...(patch.date ? { date: patch.date } : {}),
          detached: row.seriesId ? true : row.detached,
        })
        .where(eq(schema.plannedSession.id, id))
        .returning();
      return after;
    }
  });
  return plannedSessionView(updated!);
}

export async function deleteSession(actor: Actor, id: string, scope: "one" | "series") {
  const row = await loadSession(actor, id, "coach");
  const db = getDb();
  if (scope === "series" && row.seriesId) {
    await db
      .delete(schema.plannedSession)
      .where(
        and(
          eq(schema.plannedSession.seriesId, row.seriesId),
          gte(schema.plannedSession.date, row.date),
          eq(schema.plannedSession.detached, false),
        ),
      );
  } else {
    await db.delete(schema.plannedSession).where(eq(schema.plannedSession.id, id));
  }
}

export async function duplicateSession(actor: Actor, id: string, date: string) {
  const row = await loadSession(actor, id, "coach");
  return createSession(actor, row.athleteId, {
    date,
    title: row.title,
    sport: row.sport as never,
    kind: row.kind as "training" | "retest",
    structure: row.structure as Block[],
    notes: row.notes,
  });
}

/** The next retest session on or after a date, or null. */
export async function nextRetestOf(actor: Actor, athleteId: string, from: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const [row] = await getDb()
    .select({ id: schema.plannedSession.id, date: schema.plannedSession.date, title: schema.plannedSession.title })
    .from(schema.plannedSession)
    .where(
      and(
        eq(schema.plannedSession.athleteId, athleteId),
        eq(schema.plannedSession.kind, "retest"),
        gte(schema.plannedSession.date, from),
      ),
    )
    .orderBy(asc(schema.plannedSession.date))
    .limit(1);
  return row ?? null;
}
