import { requireActor } from "@/features/access/server/permissions";
import { thresholdPatchSchema } from "@/features/athlete-tests/schemas";
import { adjustThresholds } from "@/features/athlete-tests/server/tests";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const PATCH = route<RouteContext<"/api/tests/[id]/thresholds">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const body = await readJson(req, thresholdPatchSchema);
  return json(await adjustThresholds(actor, id, body));
});
