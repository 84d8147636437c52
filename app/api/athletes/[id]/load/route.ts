import { requireActor } from "@/features/access/server/permissions";
import { loadQuerySchema } from "@/features/logs/schemas";
import { athleteLoad } from "@/features/load/server/load";
import { fieldErrors, HttpError, json, parseParams, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = loadQuerySchema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!q.success) throw new HttpError(400, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD, at most 400 days apart.", { fieldErrors: fieldErrors(q.error) });
  return json(await athleteLoad(actor, id, q.data.from, q.data.to));
});
