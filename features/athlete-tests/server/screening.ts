import "server-only";
import { randomUUID } from "node:crypto";
import { desc, eq } from "drizzle-orm";
import type { z } from "zod";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import type { screeningSchema } from "../schemas";

export const SCREENING_ADVICE =
  "At least one answer is yes: obtain clearance from a physician or another licensed health professional before a maximal " +
  "test. A submaximal or field test may still be recorded at the coach's judgement.";

export async function getScreening(actor: Actor, athleteId: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const rows = await getDb()
    .select()
    .from(schema.screening)
    .where(eq(schema.screening.athleteId, athleteId))
    .orderBy(desc(schema.screening.createdAt))
    .limit(10);
  const latest = rows[0] ?? null;
  return {
    latest: latest && { answers: latest.answers, anyYes: latest.anyYes, notes: latest.notes, date: latest.createdAt },
    advice: latest?.anyYes ? SCREENING_ADVICE : null,
    history: rows.map((r) => ({ date: r.createdAt, anyYes: r.anyYes })),
  };
}

/** The athlete or their coach records the questionnaire; every save is kept with its date. */
export async function saveScreening(actor: Actor, athleteId: string, input: z.infer<typeof screeningSchema>) {
  await requireAthleteAccess(actor, athleteId, "edit");
  const anyYes = Object.values(input.answers).some(Boolean);
  await getDb().insert(schema.screening).values({ id: randomUUID(), athleteId, answers: input.answers, anyYes, notes: input.notes ?? null, recordedBy: actor.userId });
  return getScreening(actor, athleteId);
}
