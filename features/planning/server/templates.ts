import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, ilike, inArray, sql } from "drizzle-orm";
import type { z } from "zod";
import { getDb, schema } from "@/db/client";
import { coachedSquadIds, isCoachOf, type Actor } from "@/features/access/lib/rules";
import { editConflict, notFound } from "@/features/platform/server/http";
import { storedTotals, type Block } from "../lib/session";
import { templateView, type TemplateView } from "../lib/views";
import type { templatePatchSchema, templateSchema } from "../schemas";

export async function listTemplates(
  actor: Actor,
  opts: { squadId?: string; q?: string } = {},
): Promise<TemplateView[]> {
  let squads = coachedSquadIds(actor);
  if (opts.squadId) squads = squads.filter((s) => s === opts.squadId);
  if (!squads.length) return [];
  const where = [inArray(schema.sessionTemplate.squadId, squads)];
  if (opts.q) where.push(ilike(schema.sessionTemplate.name, `%${opts.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`));
  const rows = await getDb()
    .select()
    .from(schema.sessionTemplate)
    .where(and(...where))
    .orderBy(asc(schema.sessionTemplate.name));
  return rows.map(templateView);
}

async function loadTemplate(actor: Actor, id: string) {
  const [row] = await getDb().select().from(schema.sessionTemplate).where(eq(schema.sessionTemplate.id, id));
  if (!row || !isCoachOf(actor, row.squadId)) throw notFound("No such template.");
  return row;
}

export async function getTemplate(actor: Actor, id: string): Promise<TemplateView> {
  return templateView(await loadTemplate(actor, id));
}

export async function createTemplate(actor: Actor, input: z.infer<typeof templateSchema>) {
  if (!isCoachOf(actor, input.squadId)) throw notFound("No such squad.");
  const id = randomUUID();
  const [row] = await getDb()
    .insert(schema.sessionTemplate)
    .values({
      id,
      squadId: input.squadId,
      name: input.name,
      sport: input.sport,
      description: input.description ?? "",
      structure: input.structure,
      ...storedTotals(input.structure),
      createdBy: actor.userId,
    })
    .returning();
  return templateView(row!);
}

export async function updateTemplate(actor: Actor, id: string, patch: z.infer<typeof templatePatchSchema>) {
  await loadTemplate(actor, id);
  const { version, ...changes } = patch;
  const [row] = await getDb()
    .update(schema.sessionTemplate)
    .set({
      ...changes,
      ...(changes.structure ? storedTotals(changes.structure) : {}),
      version: sql`${schema.sessionTemplate.version} + 1`,
    })
    .where(
      version === undefined
        ? eq(schema.sessionTemplate.id, id)
        : and(eq(schema.sessionTemplate.id, id), eq(schema.sessionTemplate.version, version)),
    )
    .returning();
  // Nothing written: the template changed since the client read it (it exists; loadTemplate found it).
  if (!row) throw editConflict(templateView(await loadTemplate(actor, id)), "this template");
  return templateView(row);
}

export async function duplicateTemplate(actor: Actor, id: string) {
  const t = await loadTemplate(actor, id);
  return createTemplate(actor, {
    squadId: t.squadId,
    name: `${t.name} (copy)`.slice(0, 80),
    sport: t.sport as never,
    description: t.description,
    structure: t.structure as Block[],
  });
}

export async function deleteTemplate(actor: Actor, id: string) {
  await loadTemplate(actor, id);
  await getDb().delete(schema.sessionTemplate).where(eq(schema.sessionTemplate.id, id));
}
