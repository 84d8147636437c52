import { requireActor } from "@/features/access/server/permissions";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { templatePatchSchema } from "@/features/planning/schemas";
import { deleteTemplate, getTemplate, updateTemplate } from "@/features/planning/server/templates";
import { idParam } from "@/features/platform/lib/params";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await getTemplate(actor, id));
});

export const PATCH = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await updateTemplate(actor, id, await readJson(req, templatePatchSchema)));
});

export const DELETE = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  await deleteTemplate(actor, id);
  return new Response(null, { status: 204 });
});
