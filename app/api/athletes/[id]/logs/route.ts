import { requireActor } from "@/features/access/server/permissions";
import { unplannedLogSchema } from "@/features/logs/schemas";
import { listLogs, logUnplannedSession } from "@/features/logs/server/logs";
import { json, parseParams, parseQuery, readJson, route } from "@/features/platform/server/http";
import { rangeQuery } from "@/features/planning/schemas";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/logs">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = parseQuery(req, rangeQuery, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD.");
  return json(await listLogs(actor, id, q.from, q.to));
});

/** Logs an unplanned session; a repeated submit with the same clientKey returns the first log with 200. */
export const POST = route<RouteContext<"/api/athletes/[id]/logs">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { log, created } = await logUnplannedSession(actor, id, await readJson(req, unplannedLogSchema));
  return json({ ...log, alreadyLogged: !created }, { status: created ? 201 : 200 });
});
