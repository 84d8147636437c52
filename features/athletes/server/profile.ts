import "server-only";
import { eq } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server/permissions";
import type { Actor } from "@/features/access/lib/rules";
import { fieldErrors, HttpError, notFound } from "@/features/platform/server/http";
import { profileSchema, type ProfileInput } from "../schemas";

const DEFAULTS: ProfileInput = {
  birthYear: null,
  sex: null,
  bodyMassKg: null,
  restingHrBpm: null,
  maxHrBpm: null,
  sports: [],
  timeZone: "UTC",
  reminderTiming: "evening_before",
  reminderTime: "19:00",
  remindSessions: true,
  remindRetests: true,
};

function toProfile(row: typeof schema.athleteProfile.$inferSelect | undefined): ProfileInput {
  if (!row) return { ...DEFAULTS };
  return {
    birthYear: row.birthYear,
    sex: row.sex,
    bodyMassKg: row.bodyMassKg,
    restingHrBpm: row.restingHrBpm,
    maxHrBpm: row.maxHrBpm,
    sports: row.sports as ProfileInput["sports"],
    timeZone: row.timeZone,
    reminderTiming: row.reminderTiming,
    reminderTime: row.reminderTime,
    remindSessions: row.remindSessions,
    remindRetests: row.remindRetests,
  };
}

export async function getAthleteProfile(actor: Actor, athleteId: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const db = getDb();
  const [u] = await db
    .select({ id: schema.user.id, name: schema.user.name, email: schema.user.email })
    .from(schema.user)
    .where(eq(schema.user.id, athleteId));
  if (!u) throw notFound("No such athlete.");
  const [row] = await db.select().from(schema.athleteProfile).where(eq(schema.athleteProfile.userId, athleteId));
  return { athlete: u, profile: toProfile(row) };
}

/** Applies a partial update; the merged profile is validated as a whole and written in one statement. */
export async function updateAthleteProfile(actor: Actor, athleteId: string, patch: Partial<Record<keyof ProfileInput, unknown>>) {
  await requireAthleteAccess(actor, athleteId, "edit");
  const db = getDb();
  const [row] = await db.select().from(schema.athleteProfile).where(eq(schema.athleteProfile.userId, athleteId));
  const merged = { ...toProfile(row), ...patch };
  const parsed = profileSchema.safeParse(merged);
  if (!parsed.success) throw new HttpError(400, "Some fields are not valid.", { fieldErrors: fieldErrors(parsed.error) });
  const values = parsed.data;
  await db
    .insert(schema.athleteProfile)
    .values({ userId: athleteId, ...values })
    .onConflictDoUpdate({ target: schema.athleteProfile.userId, set: values });
  return values;
}
