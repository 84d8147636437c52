import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";
import { chooseZoneSet } from "@/features/zones/server";

/** POST /api/zone-sets/:id/choose: this set is in force over others of the same sport and day (the athlete's coaches). */
export const POST = route<RouteContext<"/api/zone-sets/[id]/choose">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await chooseZoneSet(actor, id));
});
