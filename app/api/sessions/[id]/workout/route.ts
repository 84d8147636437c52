import { requireActor } from "@/features/access/server/permissions";
import { downloadResponse, workoutFile } from "@/features/exports/server/exports";
import { idParam } from "@/features/platform/lib/params";
import { parseParams, route } from "@/features/platform/server/http";

/** GET /api/sessions/:id/workout: the session as a FIT workout file (steps and targets in the athlete's zones). */
export const GET = route<RouteContext<"/api/sessions/[id]/workout">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return downloadResponse(await workoutFile(actor, id));
});
