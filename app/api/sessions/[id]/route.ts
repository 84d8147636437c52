import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { HttpError, json, parseParams, readJson, route } from "@/features/platform/server/http";
import { isoDate, patchSessionSchema } from "@/features/planning/schemas";
import { deleteSession, duplicateSession, updateSession } from "@/features/planning/server/planning";
import { idParam } from "@/features/platform/lib/params";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ id: string }> };

export const PATCH = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await updateSession(actor, id, await readJson(req, patchSessionSchema)));
});

/** Duplicate: POST {date} copies the session to that day. */
export const POST = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const body = await readJson(req, z.object({ date: isoDate }).strict());
  return json(await duplicateSession(actor, id, body.date), { status: 201 });
});

export const DELETE = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const scope = new URL(req.url).searchParams.get("scope") ?? "one";
  if (scope !== "one" && scope !== "series") throw new HttpError(400, "scope is one or series.");
  await deleteSession(actor, id, scope);
  return new Response(null, { status: 204 });
});
