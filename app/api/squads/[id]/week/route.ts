import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, parseQuery, route } from "@/features/platform/server/http";
import { isoDate } from "@/features/planning/schemas";
import { squadWeek } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";

/** GET /api/squads/:id/week?week=YYYY-MM-DD: every athlete's sessions and budget state in that ISO week. */
export const GET = route<RouteContext<"/api/squads/[id]/week">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { week } = parseQuery(req, z.object({ week: isoDate }), "Give ?week=YYYY-MM-DD.");
  return json(await squadWeek(actor, id, week));
});
