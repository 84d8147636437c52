import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { templatePatchSchema } from "@/features/planning/schemas";
import { deleteTemplate, getTemplate, updateTemplate } from "@/features/planning/server/templates";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/templates/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await getTemplate(actor, id));
});

export const PATCH = route<RouteContext<"/api/templates/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await updateTemplate(actor, id, await readJson(req, templatePatchSchema)));
});

export const DELETE = route<RouteContext<"/api/templates/[id]">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  await deleteTemplate(actor, id);
  return new Response(null, { status: 204 });
});
