import { requireActor } from "@/features/access/server/permissions";
import { parseParams, parseQuery, route } from "@/features/platform/server/http";
import { rangeQuery } from "@/features/planning/schemas";
import { weekSummariesJson } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/weeks">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = parseQuery(req, rangeQuery, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD.");
  const body = await weekSummariesJson(actor, id, q.from, q.to);
  return new Response(body, { headers: { "content-type": "application/json", "cache-control": "no-store" } });
});
