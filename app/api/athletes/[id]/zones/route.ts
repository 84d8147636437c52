import { z } from "zod";
import { isoDate } from "@/features/platform/lib/date-schema";
import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, parseQuery, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";
import { getZones } from "@/features/zones/server/zone-sets";

const query = z.object({ date: isoDate.optional() });

export const GET = route<RouteContext<"/api/athletes/[id]/zones">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = parseQuery(req, query, "Give the date as ?date=YYYY-MM-DD.");
  return json(await getZones(actor, id, q.date));
});
