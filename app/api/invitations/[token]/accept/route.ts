import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, route } from "@/features/platform/server/http";
import { tokenParam } from "@/features/platform/lib/params";
import { acceptInvitation } from "@/features/squads/server/squads";

export const POST = route<RouteContext<"/api/invitations/[token]/accept">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { token } = parseParams(await ctx.params, tokenParam);
  return json(await acceptInvitation(actor, token));
});
