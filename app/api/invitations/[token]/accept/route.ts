import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, route } from "@/features/platform/server/http";
import { tokenParam } from "@/features/platform/lib/params";
import { acceptInvitation } from "@/features/squads/server/squads";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ token: string }> };

export const POST = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { token } = parseParams(await ctx.params, tokenParam);
  return json(await acceptInvitation(actor, token));
});
