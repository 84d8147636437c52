import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { parseParams, route } from "@/features/platform/server/http";
import { withdrawInvitation } from "@/features/squads/server/squads";

const params = z.object({ id: z.string().min(1).max(100), invitationId: z.string().min(1).max(100) });

/** DELETE: the head coach withdraws an open invitation; its link then says so. 204, or 404 when it is not open. */
export const DELETE = route<RouteContext<"/api/squads/[id]/invitations/[invitationId]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id, invitationId } = parseParams(await ctx.params, params);
  await withdrawInvitation(actor, id, invitationId);
  return new Response(null, { status: 204 });
});
