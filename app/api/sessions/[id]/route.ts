import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, parseQuery, readJson, route } from "@/features/platform/server/http";
import { isoDate, patchSessionSchema } from "@/features/planning/schemas";
import { deleteSession, duplicateSession, updateSession } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";

export const PATCH = route<RouteContext<"/api/sessions/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await updateSession(actor, id, await readJson(req, patchSessionSchema)));
});

/** Duplicate: POST {date} copies the session to that day. */
export const POST = route<RouteContext<"/api/sessions/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const body = await readJson(req, z.object({ date: isoDate }).strict());
  return json(await duplicateSession(actor, id, body.date), { status: 201 });
});

const deleteQuery = z.object({ scope: z.enum(["one", "series"]).default("one") });

export const DELETE = route<RouteContext<"/api/sessions/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { scope } = parseQuery(req, deleteQuery, "scope is one or series.");
  await deleteSession(actor, id, scope);
  return new Response(null, { status: 204 });
});
