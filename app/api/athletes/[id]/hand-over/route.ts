import { requireActor } from "@/features/access/server/permissions";
import { idParam } from "@/features/platform/lib/params";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { handOverSchema } from "@/features/squads/schemas";
import { handOverManagedAthlete } from "@/features/squads/server/managed";

/** POST {email}: a coach hands a managed profile over to the athlete's address (a link to choose a password goes there). */
export const POST = route<RouteContext<"/api/athletes/[id]/hand-over">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { email } = await readJson(req, handOverSchema);
  return json(await handOverManagedAthlete(actor, id, email));
});
