import { requireActor } from "@/features/access/server/permissions";
import { clearanceSchema } from "@/features/athlete-tests/schemas";
import { saveClearance } from "@/features/athlete-tests/server/screening";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

/** POST: a coach records a medical clearance for the athlete's latest readiness answers (201 with the new state). */
export const POST = route<RouteContext<"/api/athletes/[id]/screening/clearance">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await saveClearance(actor, id, await readJson(req, clearanceSchema)), { status: 201 });
});
