import { requireActor } from "@/features/access/server/permissions";
import { loadQuerySchema } from "@/features/logs/schemas";
import { athleteLoad } from "@/features/load/server/load";
import { json, parseParams, parseQuery, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/load">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = parseQuery(req, loadQuerySchema, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD, at most 400 days apart.");
  return json(await athleteLoad(actor, id, q.from, q.to));
});
