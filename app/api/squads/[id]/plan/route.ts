import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { groupPlanSchema } from "@/features/planning/schemas";
import { planForSquad } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";

/**
 * POST /api/squads/:id/plan: a template on one day for several athletes of the squad, or one athlete's week copied into
 * later weeks for several athletes; with `preview: true` nothing is written and each athlete's week after it is answered.
 */
export const POST = route<RouteContext<"/api/squads/[id]/plan">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const input = await readJson(req, groupPlanSchema);
  const answer = await planForSquad(actor, id, input);
  return json(answer, { status: answer.preview ? 200 : 201 });
});
