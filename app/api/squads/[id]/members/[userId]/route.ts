import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { parseParams, route } from "@/features/platform/server/http";
import { removeMember } from "@/features/squads/server/squads";

const params = z.object({ id: z.string().min(1).max(100), userId: z.string().min(1).max(100) });

export const DELETE = route<RouteContext<"/api/squads/[id]/members/[userId]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const p = parseParams(await ctx.params, params);
  await removeMember(actor, p.id, p.userId);
  return new Response(null, { status: 204 });
});
