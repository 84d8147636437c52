import { requireActor } from "@/features/access/server/permissions";
import { getTest } from "@/features/athlete-tests/server/tests";
import { json, parseParams, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/tests/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await getTest(actor, id));
});
