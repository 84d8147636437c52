import { requireActor } from "@/features/access/server/permissions";
import { patchLogSchema } from "@/features/logs/schemas";
import { deleteLog, updateLog } from "@/features/logs/server/logs";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const PATCH = route<RouteContext<"/api/logs/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await updateLog(actor, id, await readJson(req, patchLogSchema)));
});

export const DELETE = route<RouteContext<"/api/logs/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  await deleteLog(actor, id);
  return new Response(null, { status: 204 });
});
