import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, gte, inArray, lte } from "drizzle-orm";
import type { z } from "zod";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess, requireAthleteAccessOrNotFound } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { editConflict, HttpError, notFound } from "@/features/platform/server/http";
import { addDays } from "@/features/platform/lib/days";
import { planSeason, SeasonError, type SeasonWeek } from "../lib/season";
import { storedTotals, type Block } from "../lib/session";
import type { seasonSchema, seasonWeekPatchSchema } from "../schemas";
import { seasonView } from "../lib/views";

/** Seasons: generate one with its retest sessions, edit a week of it, list an athlete's seasons. */

/**
 * The retest a season places: an incremental test in 3-minute stages from easy to hard, the shape a talk test or a field
 * ramp needs to find both thresholds (a steady block in one zone cannot locate a zone edge). Stages of a few minutes as in
 * the talk-test studies of Foster and colleagues (from memory); a laboratory ramp follows the laboratory's own protocol.
 */
const RETEST_STRUCTURE: Block[] = [
  { type: "step", kind: "warmup", durationS: 600, zone: 1 },
  { type: "step", kind: "work", durationS: 180, zone: 1 },
  { type: "step", kind: "work", durationS: 180, zone: 1 },
  { type: "step", kind: "work", durationS: 180, zone: 2 },
  { type: "step", kind: "work", durationS: 180, zone: 2 },
  { type: "step", kind: "work", durationS: 180, zone: 3 },
  { type: "step", kind: "work", durationS: 180, zone: 3 },
  { type: "step", kind: "cooldown", durationS: 600, zone: 1 },
];
const RETEST_NOTES =
  "Retest to keep the zones in step with fitness: 3-minute stages, each a little harder, until speaking is no longer comfortable (a talk test) or as the laboratory's protocol says. Answer the readiness questions first; stop at any warning sign.";

/** Generates a season and places its retest sessions (Wednesday of each retest week); one transaction. */
export async function createSeason(actor: Actor, athleteId: string, input: z.infer<typeof seasonSchema>) {
  await requireAthleteAccess(actor, athleteId, "coach");
  let weeks;
  try {
    weeks = planSeason({
      startDate: input.startDate,
      events: input.events,
      weeklyHours: input.weeklyHours,
      level: input.level,
      loadingWeeks: input.loadingWeeks,
      retestEveryWeeks: input.retestEveryWeeks,
    });
  } catch (e) {
    if (e instanceof SeasonError) throw new HttpError(400, e.message);
    throw e;
  }
  const id = randomUUID();
  await getDb().transaction(async (tx) => {
    await tx.insert(schema.season).values({
      id,
      athleteId,
      name: input.name,
      sport: input.sport,
      startDate: weeks[0]!.weekStart,
      events: input.events,
      weeklyHours: input.weeklyHours,
      level: input.level,
      retestEveryWeeks: input.retestEveryWeeks,
      weeks: weeks as unknown as Record<string, unknown>[],
      createdBy: actor.userId,
    });
    for (const w of weeks.filter((x) => x.retest)) {
      await tx.insert(schema.plannedSession).values({
        id: randomUUID(),
        athleteId,
        date: addDays(w.weekStart, 2),
        kind: "retest",
        sport: input.sport,
        title: "Retest: stepped threshold test",
        structure: RETEST_STRUCTURE,
        ...storedTotals(RETEST_STRUCTURE),
        createdBy: actor.userId,
        notes: RETEST_NOTES,
      });
    }
  });
  return { id, weeks };
}

/**
 * Edits one week of a season (block, role, volume target, budget, retest). Turning the retest on places a retest session on
 * the Wednesday of that week; turning it off removes the week's retest sessions that have no log. One transaction.
 */
export async function updateSeasonWeek(
  actor: Actor,
  seasonId: string,
  weekStart: string,
  patch: z.infer<typeof seasonWeekPatchSchema>,
) {
  const db = getDb();
  const [row] = await db.select().from(schema.season).where(eq(schema.season.id, seasonId));
  if (!row) throw notFound("No such season.");
  await requireAthleteAccessOrNotFound(actor, row.athleteId, "view", "No such season.");
  await requireAthleteAccess(actor, row.athleteId, "coach");
  const weeks = row.weeks as unknown as SeasonWeek[];
  const index = weeks.findIndex((w) => w.weekStart === weekStart);
  if (index < 0)
    throw new HttpError(400, `The season has no week starting ${weekStart}.`, {
      fieldErrors: { weekStart: ["Choose a Monday of this season."] },
    });
  const { version, ...changes } = patch;
  let after: SeasonWeek = { ...weeks[index]!, ...changes };
  let before: SeasonWeek = weeks[index]!;
  let nextVersion = row.version + 1;
  await db.transaction(async (tx) => {
    // The season as it is now, locked until the change is written: a change made on an older version is refused.
    const [current] = await tx.select().from(schema.season).where(eq(schema.season.id, seasonId)).for("update");
    if (!current) throw notFound("No such season.");
    if (version !== undefined && current.version !== version)
      throw editConflict({ id: current.id, version: current.version, weeks: current.weeks }, "this season");
    const currentWeeks = current.weeks as unknown as SeasonWeek[];
    before = currentWeeks[index]!;
    after = { ...before, ...changes };
    nextVersion = current.version + 1;
    const next = currentWeeks.map((w, i) => (i === index ? after : w));
    await tx
      .update(schema.season)
      .set({ weeks: next as unknown as Record<string, unknown>[], version: nextVersion })
      .where(eq(schema.season.id, seasonId));
    const weekEnd = addDays(weekStart, 6);
    if (after.retest && !before.retest) {
      const existing = await tx
        .select({ id: schema.plannedSession.id })
        .from(schema.plannedSession)
        .where(
          and(
            eq(schema.plannedSession.athleteId, row.athleteId),
            eq(schema.plannedSession.kind, "retest"),
            gte(schema.plannedSession.date, weekStart),
            lte(schema.plannedSession.date, weekEnd),
          ),
        );
      if (!existing.length) {
        await tx.insert(schema.plannedSession).values({
          id: randomUUID(),
          athleteId: row.athleteId,
          date: addDays(weekStart, 2),
          kind: "retest",
          sport: row.sport,
          title: "Retest: stepped threshold test",
          structure: RETEST_STRUCTURE,
          ...storedTotals(RETEST_STRUCTURE),
          createdBy: actor.userId,
          notes: RETEST_NOTES,
        });
      }
    } else if (!after.retest && before.retest) {
      const retests = await tx
        .select({ id: schema.plannedSession.id })
        .from(schema.plannedSession)
        .where(
          and(
            eq(schema.plannedSession.athleteId, row.athleteId),
            eq(schema.plannedSession.kind, "retest"),
            gte(schema.plannedSession.date, weekStart),
            lte(schema.plannedSession.date, weekEnd),
          ),
        );
      const logged = retests.length
        ? await tx
            .select({ id: schema.sessionLog.plannedSessionId })
            .from(schema.sessionLog)
            .where(
              inArray(
                schema.sessionLog.plannedSessionId,
                retests.map((r) => r.id),
              ),
            )
        : [];
      const keep = new Set(logged.map((l) => l.id));
      const drop = retests.filter((r) => !keep.has(r.id)).map((r) => r.id);
      if (drop.length) await tx.delete(schema.plannedSession).where(inArray(schema.plannedSession.id, drop));
    }
  });
  return { id: seasonId, week: after, version: nextVersion };
}

export async function listSeasons(actor: Actor, athleteId: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const rows = await getDb()
    .select()
    .from(schema.season)
    .where(eq(schema.season.athleteId, athleteId))
    .orderBy(asc(schema.season.startDate));
  return rows.map(seasonView);
}
