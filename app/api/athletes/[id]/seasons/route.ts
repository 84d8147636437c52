import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { seasonSchema } from "@/features/planning/schemas";
import { createSeason, listSeasons } from "@/features/planning/server";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/seasons">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await listSeasons(actor, id));
});

export const POST = route<RouteContext<"/api/athletes/[id]/seasons">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await createSeason(actor, id, await readJson(req, seasonSchema)), { status: 201 });
});
