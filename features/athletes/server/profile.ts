import "server-only";
import { eq, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { editConflict, fieldErrors, HttpError, notFound } from "@/features/platform/server/http";
import { DEFAULT_PLANNING_RULES } from "@/features/planning/lib/rules";
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
  ...DEFAULT_PLANNING_RULES,
};

/** The fields only the athlete's coaches set (an athlete's own edit may not change them). */
const COACH_FIELDS = ["maxHardDays", "hardDaysBackToBack", "volumeTolerancePct"] as const;

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
    maxHardDays: row.maxHardDays,
    hardDaysBackToBack: row.hardDaysBackToBack,
    volumeTolerancePct: row.volumeTolerancePct,
  };
}

export async function getAthleteProfile(actor: Actor, athleteId: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const db = getDb();
  const [u] = await db
    .select({ id: schema.user.id, name: schema.user.name, email: schema.user.email, managed: schema.user.managed })
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
    const current = toProfile(row);
    if (actor.userId === athleteId && COACH_FIELDS.some((f) => f in changes && changes[f] !== current[f]))
      throw new HttpError(403, "Your coach sets the planning rules (hard days and volume tolerance).");
    const merged = { ...current, ...changes };
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
