import "server-only";
import { randomUUID } from "node:crypto";
import { and, eq, gte, inArray, lte } from "drizzle-orm";
import type { z } from "zod";
import { getDb, schema } from "@/db/client";
import { requireAthleteAccess } from "@/features/access/server";
import { isCoachOf, type Actor } from "@/features/access/lib/rules";
import { HttpError, notFound } from "@/features/platform/server/http";
import { addDays, dayNumber } from "@/features/platform/lib/days";
import { storedTotals, type Block } from "../lib/session";
import type { WeekSession, WeekSummary } from "../lib/weeks";
import type { copyWeekSchema, groupPlanSchema } from "../schemas";
import { weeksWithAdditions } from "./weeks";

/**
 * Planning for groups: a template on one day for several athletes of a squad, or one athlete's week copied into later
 * weeks for several athletes (their own plan included). Sessions keep their steps in zones, so each athlete's targets come
 * from their own zone set. A preview answers every athlete's week after the action without writing; the action itself is
 * one transaction with one insert.
 */

interface NewSession {
  athleteId: string;
  date: string;
  title: string;
  sport: string;
  kind: string;
  structure: Block[];
  templateId: string | null;
  notes: string;
}

export interface GroupPlanAnswer {
  preview: boolean;
  created: number;
  athletes: {
    athleteId: string;
    name: string;
    sessions: number;
    weeks: { weekStart: string; before: WeekSummary; after: WeekSummary }[];
  }[];
}

/** The athletes given, all athletes of the squad (else 400 naming the first that is not). */
async function squadAthletes(squadId: string, ids: string[]) {
  const rows = await getDb()
    .select({ id: schema.user.id, name: schema.user.name })
    .from(schema.membership)
    .innerJoin(schema.user, eq(schema.user.id, schema.membership.userId))
    .where(
      and(
        eq(schema.membership.squadId, squadId),
        eq(schema.membership.role, "athlete"),
        inArray(schema.membership.userId, ids),
      ),
    );
  const found = new Map(rows.map((r) => [r.id, r.name]));
  const missing = ids.find((id) => !found.has(id));
  if (missing)
    throw new HttpError(400, "Some athletes are not in this squad.", {
      fieldErrors: { athleteIds: [`${missing} is not an athlete of this squad.`] },
    });
  return ids.map((id) => ({ id, name: found.get(id)! }));
}

/** The training sessions of an athlete's week (retests are each athlete's own and are never copied). */
async function weekSessions(athleteId: string, monday: string) {
  return getDb()
    .select()
    .from(schema.plannedSession)
    .where(
      and(
        eq(schema.plannedSession.athleteId, athleteId),
        gte(schema.plannedSession.date, monday),
        lte(schema.plannedSession.date, addDays(monday, 6)),
        eq(schema.plannedSession.kind, "training"),
      ),
    );
}

async function previewOrWrite(
  actor: Actor,
  athletes: { id: string; name: string }[],
  rows: NewSession[],
  preview: boolean,
): Promise<GroupPlanAnswer> {
  const additions = new Map<string, WeekSession[]>();
  for (const r of rows) {
    const list = additions.get(r.athleteId) ?? [];
    list.push({
      id: `new-${list.length}`,
      date: r.date,
      title: r.title,
      kind: r.kind,
      sport: r.sport,
      ...storedTotals(r.structure),
    });
    additions.set(r.athleteId, list);
  }
  const weeks = await weeksWithAdditions(
    athletes.map((a) => a.id),
    additions,
  );
  if (!preview && rows.length) {
    await getDb().transaction(async (tx) => {
      await tx.insert(schema.plannedSession).values(
        rows.map((r) => ({
          id: randomUUID(),
          createdBy: actor.userId,
          ...r,
          ...storedTotals(r.structure),
        })),
      );
    });
  }
  return {
    preview,
    created: preview ? 0 : rows.length,
    athletes: athletes.map((a) => ({
      athleteId: a.id,
      name: a.name,
      sessions: additions.get(a.id)?.length ?? 0,
      weeks: weeks.get(a.id) ?? [],
    })),
  };
}

/** A week's sessions shifted into each target week, for each athlete. */
function copiesOf(
  source: Awaited<ReturnType<typeof weekSessions>>,
  sourceWeek: string,
  targetWeeks: string[],
  athleteIds: string[],
): NewSession[] {
  return athleteIds.flatMap((athleteId) =>
    targetWeeks.flatMap((w) =>
      source.map((s) => ({
        athleteId,
        date: addDays(s.date, dayNumber(w) - dayNumber(sourceWeek)),
        title: s.title,
        sport: s.sport,
        kind: "training",
        structure: s.structure as Block[],
        templateId: s.templateId,
        notes: s.notes,
      })),
    ),
  );
}

/** POST /api/squads/:id/plan. */
export async function planForSquad(
  actor: Actor,
  squadId: string,
  input: z.infer<typeof groupPlanSchema>,
): Promise<GroupPlanAnswer> {
  if (!isCoachOf(actor, squadId)) {
    if (!actor.memberships.some((m) => m.squadId === squadId)) throw notFound("No such squad.");
    throw new HttpError(403, "Only the squad's coaches plan for its athletes.");
  }
  const athletes = await squadAthletes(squadId, input.athleteIds);
  if (input.mode === "template") {
    const [t] = await getDb()
      .select()
      .from(schema.sessionTemplate)
      .where(eq(schema.sessionTemplate.id, input.templateId));
    if (!t || !isCoachOf(actor, t.squadId))
      throw new HttpError(400, "Unknown template.", {
        fieldErrors: { templateId: ["No such template in your squads."] },
      });
    const rows = athletes.map((a) => ({
      athleteId: a.id,
      date: input.date,
      title: t.name,
      sport: t.sport,
      kind: "training",
      structure: t.structure as Block[],
      templateId: t.id,
      notes: "",
    }));
    return previewOrWrite(actor, athletes, rows, input.preview);
  }
  await requireAthleteAccess(actor, input.sourceAthleteId, "coach");
  if (input.athleteIds.includes(input.sourceAthleteId) && input.targetWeeks.includes(input.sourceWeek))
    throw new HttpError(400, "A week cannot be copied onto itself.", {
      fieldErrors: { targetWeeks: ["Choose weeks other than the one copied, or leave its athlete out."] },
    });
  const source = await weekSessions(input.sourceAthleteId, input.sourceWeek);
  if (!source.length)
    throw new HttpError(400, "That week holds no training sessions to copy.", {
      fieldErrors: { sourceWeek: ["Plan the week first, or choose another one."] },
    });
  return previewOrWrite(
    actor,
    athletes,
    copiesOf(source, input.sourceWeek, input.targetWeeks, input.athleteIds),
    input.preview,
  );
}

/** POST /api/athletes/:id/weeks/:weekStart/copy: the athlete's own week into later weeks of their plan. */
export async function copyWeek(
  actor: Actor,
  athleteId: string,
  sourceWeek: string,
  input: z.infer<typeof copyWeekSchema>,
): Promise<GroupPlanAnswer> {
  await requireAthleteAccess(actor, athleteId, "coach");
  if (input.targetWeeks.includes(sourceWeek))
    throw new HttpError(400, "A week cannot be copied onto itself.", {
      fieldErrors: { targetWeeks: ["Choose weeks other than the one copied."] },
    });
  const source = await weekSessions(athleteId, sourceWeek);
  if (!source.length)
    throw new HttpError(400, "That week holds no training sessions to copy.", {
      fieldErrors: { sourceWeek: ["Plan the week first, or choose another one."] },
    });
  const [u] = await getDb().select({ name: schema.user.name }).from(schema.user).where(eq(schema.user.id, athleteId));
  return previewOrWrite(
    actor,
    [{ id: athleteId, name: u?.name ?? "" }],
    copiesOf(source, sourceWeek, input.targetWeeks, [athleteId]),
    input.preview,
  );
}
