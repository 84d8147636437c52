import { requireActor } from "@/features/access/server/permissions";
import { screeningSchema } from "@/features/athlete-tests/schemas";
import { getScreening, saveScreening } from "@/features/athlete-tests/server/screening";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/screening">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await getScreening(actor, id));
});

export const PUT = route<RouteContext<"/api/athletes/[id]/screening">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const body = await readJson(req, screeningSchema);
  return json(await saveScreening(actor, id, body));
});
