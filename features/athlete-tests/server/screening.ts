import "server-only";
import { randomUUID } from "node:crypto";
import { desc, eq, sql } from "drizzle-orm";
import type { z } from "zod";
import { anyOf, getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { addDays } from "@/features/platform/lib/days";
import { localDate } from "@/features/platform/lib/dates";
import { HttpError } from "@/features/platform/server/http";
import { readiness, testAllowed, type Readiness, type ReadinessInput } from "../lib/readiness";
import type { clearanceSchema, screeningSchema } from "../schemas";

/** The readiness inputs of several athletes in two queries (latest screening each, and their clearances). */
export async function readinessInputs(athleteIds: string[]): Promise<Map<string, Omit<ReadinessInput, "today">>> {
  const out = new Map<string, Omit<ReadinessInput, "today">>(
    athleteIds.map((id) => [id, { latest: null, clearances: [] }]),
  );
  if (!athleteIds.length) return out;
  const db = getDb();
  const [screenings, clearances] = await Promise.all([
    db
      .selectDistinctOn([schema.screening.athleteId], {
        athleteId: schema.screening.athleteId,
        answers: schema.screening.answers,
        createdAt: schema.screening.createdAt,
      })
      .from(schema.screening)
      .where(sql`${schema.screening.athleteId} = ${anyOf(athleteIds)}`)
      .orderBy(schema.screening.athleteId, desc(schema.screening.createdAt)),
    db
      .select()
      .from(schema.screeningClearance)
      .where(sql`${schema.screeningClearance.athleteId} = ${anyOf(athleteIds)}`),
  ]);
  for (const s of screenings)
    out.get(s.athleteId)!.latest = { answeredAt: s.createdAt.toISOString(), answers: s.answers };
  for (const c of clearances)
    out.get(c.athleteId)!.clearances.push({
      recordedAt: c.createdAt.toISOString(),
      clearedBy: c.clearedBy,
      role: c.role,
      clearedOn: c.clearedOn,
      note: c.note,
    });
  return out;
}

async function athleteToday(athleteId: string, now = new Date()): Promise<string> {
  const [p] = await getDb()
    .select({ timeZone: schema.athleteProfile.timeZone })
    .from(schema.athleteProfile)
    .where(eq(schema.athleteProfile.userId, athleteId));
  return localDate(now, p?.timeZone ?? "UTC");
}

/** One athlete's readiness today (no access check: for server code that has checked it). */
export async function readinessOf(athleteId: string, now = new Date()): Promise<Readiness> {
  const [inputs, today] = await Promise.all([readinessInputs([athleteId]), athleteToday(athleteId, now)]);
  return readiness({ ...inputs.get(athleteId)!, today });
}

export async function getScreening(actor: Actor, athleteId: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const db = getDb();
  const [rows, clearances, state] = await Promise.all([
    db
      .select()
      .from(schema.screening)
      .where(eq(schema.screening.athleteId, athleteId))
      .orderBy(desc(schema.screening.createdAt))
      .limit(10),
    db
      .select()
      .from(schema.screeningClearance)
      .where(eq(schema.screeningClearance.athleteId, athleteId))
      .orderBy(desc(schema.screeningClearance.createdAt))
      .limit(10),
    readinessOf(athleteId),
  ]);
  const latest = rows[0] ?? null;
  return {
    latest: latest && { answers: latest.answers, anyYes: latest.anyYes, notes: latest.notes, date: latest.createdAt },
    readiness: state,
    /** The one paragraph to show where a test or hard training is planned, or null when nothing stands in the way. */
    advice: state.whatToDo,
    history: rows.map((r) => ({ date: r.createdAt, anyYes: r.anyYes })),
    clearances: clearances.map((c) => ({
      clearedBy: c.clearedBy,
      role: c.role,
      clearedOn: c.clearedOn,
      note: c.note,
      recordedAt: c.createdAt,
    })),
  };
}

/** The athlete or their coach records the questionnaire; every save is kept with its date. */
export async function saveScreening(actor: Actor, athleteId: string, input: z.infer<typeof screeningSchema>) {
  await requireAthleteAccess(actor, athleteId, "edit");
  const anyYes = Object.values(input.answers).some(Boolean);
  await getDb()
    .insert(schema.screening)
    .values({
      id: randomUUID(),
      athleteId,
      answers: input.answers,
      anyYes,
      notes: input.notes ?? null,
      recordedBy: actor.userId,
    });
  return getScreening(actor, athleteId);
}

/** A coach records a clearance as told (who cleared, their role, the date); it counts for the answers given before it. */
export async function saveClearance(actor: Actor, athleteId: string, input: z.infer<typeof clearanceSchema>) {
  await requireAthleteAccess(actor, athleteId, "coach");
  const today = await athleteToday(athleteId);
  if (input.clearedOn > addDays(today, 1))
    throw new HttpError(400, "A clearance cannot be dated in the future.", {
      fieldErrors: { clearedOn: ["Give the date the clearance was given."] },
    });
  const [latest] = await getDb()
    .select({ createdAt: schema.screening.createdAt })
    .from(schema.screening)
    .where(eq(schema.screening.athleteId, athleteId))
    .orderBy(desc(schema.screening.createdAt))
    .limit(1);
  if (!latest)
    throw new HttpError(409, "There are no readiness answers to clear yet: the athlete answers the questions first.");
  await getDb()
    .insert(schema.screeningClearance)
    .values({
      id: randomUUID(),
      athleteId,
      clearedBy: input.clearedBy,
      role: input.role,
      clearedOn: input.clearedOn,
      note: input.note ?? null,
      recordedBy: actor.userId,
    });
  return getScreening(actor, athleteId);
}

/** Refuses a test the athlete's readiness does not allow (409 with the reason and what to do). */
export async function requireTestAllowed(
  athleteId: string,
  kind: "gas_exchange" | "talk" | "submax" | "manual",
): Promise<void> {
  const r = await readinessOf(athleteId);
  if (testAllowed(r, kind)) return;
  const what =
    r.tests === "submaximal"
      ? "A maximal test (a gas-exchange ramp to exhaustion) needs a recorded clearance."
      : "No test can be recorded now.";
  throw new HttpError(409, `${what} ${r.whatToDo ?? ""}`.trim(), {
    readiness: { status: r.status, label: r.label, reasons: r.reasons },
  });
}
