import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { parseParams, route } from "@/features/platform/server/http";
import { removeMember } from "@/features/squads/server/squads";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string; userId: string }> };
const params = z.object({ id: z.string().min(1).max(100), userId: z.string().min(1).max(100) });

export const DELETE = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const p = parseParams(await ctx.params, params);
  await removeMember(actor, p.id, p.userId);
  return new Response(null, { status: 204 });
});
