import { requireActor } from "@/features/access/server/permissions";
import { idParam } from "@/features/platform/lib/params";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { managedAthleteSchema } from "@/features/squads/schemas";
import { addManagedAthlete } from "@/features/squads/server/managed";

/** POST {name, sports}: a coach of the squad adds an athlete who has no e-mail address yet (a managed profile). */
export const POST = route<RouteContext<"/api/squads/[id]/athletes">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await addManagedAthlete(actor, id, await readJson(req, managedAthleteSchema)), { status: 201 });
});
