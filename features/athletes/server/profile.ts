import "server-only";
import { eq, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { editConflict, fieldErrors, HttpError, notFound } from "@/features/platform/server/http";
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
  return { athlete: u, profile: { ...toProfile(row), version: row?.version ?? 1 } };
}

/** Applies a partial update; the merged profile is validated as a whole and written in one statement. */
export async function updateAthleteProfile(
  actor: Actor,
  athleteId: string,
  patch: Partial<Record<keyof ProfileInput, unknown>>,
) {
  await requireAthleteAccess(actor, athleteId, "edit");
  const { version, ...changes } = patch as typeof patch & { version?: number };
  return getDb().transaction(async (tx) => {
    // The profile as it is now, locked until the change is written: a change made on an older version is refused.
    const [row] = await tx
      .select()
      .from(schema.athleteProfile)
      .where(eq(schema.athleteProfile.userId, athleteId))
      .for("update");
    if (version !== undefined && (row?.version ?? 1) !== version)
      throw editConflict({ ...toProfile(row), version: row?.version ?? 1 }, "this profile");
    const merged = { ...toProfile(row), ...changes };
    const parsed = profileSchema.safeParse(merged);
    if (!parsed.success)
      throw new HttpError(400, "Some fields are not valid.", { fieldErrors: fieldErrors(parsed.error) });
    const values = parsed.data;
    const [written] = await tx
      .insert(schema.athleteProfile)
      .values({ userId: athleteId, ...values })
      .onConflictDoUpdate({
        target: schema.athleteProfile.userId,
        set: { ...values, version: sql`${schema.athleteProfile.version} + 1` },
      })
      .returning({ version: schema.athleteProfile.version });
    return { ...values, version: written!.version };
  });
}
