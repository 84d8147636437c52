import { requireActor } from "@/features/access/server/permissions";
import { profilePatchSchema } from "@/features/athletes/schemas";
import { getAthleteProfile, updateAthleteProfile } from "@/features/athletes/server/profile";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/profile">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await getAthleteProfile(actor, id));
});

export const PATCH = route<RouteContext<"/api/athletes/[id]/profile">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const patch = await readJson(req, profilePatchSchema);
  return json({ profile: await updateAthleteProfile(actor, id, patch) });
});
