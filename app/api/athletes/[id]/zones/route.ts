import { z } from "zod";
import { isoDate } from "@/features/platform/lib/date-schema";
import { requireActor } from "@/features/access/server/permissions";
import { HttpError, json, parseParams, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";
import { getZones } from "@/features/zones/server/zone-sets";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };
const query = z.object({ date: isoDate.optional() });

export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = query.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!q.success) throw new HttpError(400, "Give the date as ?date=YYYY-MM-DD.");
  return json(await getZones(actor, id, q.data.date));
});
