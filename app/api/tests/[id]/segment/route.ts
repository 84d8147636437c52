import { requireActor } from "@/features/access/server/permissions";
import { segmentSchema } from "@/features/athlete-tests/schemas";
import { resegmentTest } from "@/features/athlete-tests/server/tests";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

/** Sets the test segment by hand ({fromS, toS} in seconds; nulls give it back to the finder) and analyses the file again. */
export const PUT = route<RouteContext<"/api/tests/[id]/segment">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const body = await readJson(req, segmentSchema);
  return json(await resegmentTest(actor, id, body));
});
