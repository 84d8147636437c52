import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { inviteSchema } from "@/features/squads/schemas";
import { idParam } from "@/features/platform/lib/params";
import { inviteToSquad, listOpenInvitations } from "@/features/squads/server/squads";
import { publicOrigin } from "@/features/platform/server/origin";

export const GET = route<RouteContext<"/api/squads/[id]/invitations">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await listOpenInvitations(actor, id));
});

export const POST = route<RouteContext<"/api/squads/[id]/invitations">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const body = await readJson(req, inviteSchema);
  return json(await inviteToSquad(actor, id, body, publicOrigin()), { status: 201 });
});
