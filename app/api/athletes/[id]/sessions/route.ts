import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, parseQuery, readJson, route } from "@/features/platform/server/http";
import { createSessionSchema, rangeQuery } from "@/features/planning/schemas";
import { createSession, listSessions } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/sessions">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = parseQuery(req, rangeQuery, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD.");
  return json(await listSessions(actor, id, q.from, q.to));
});

export const POST = route<RouteContext<"/api/athletes/[id]/sessions">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await createSession(actor, id, await readJson(req, createSessionSchema)), { status: 201 });
});
