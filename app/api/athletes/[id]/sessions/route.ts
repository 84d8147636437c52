import { requireActor } from "@/features/access/server/permissions";
import { fieldErrors, HttpError, json, parseParams, readJson, route } from "@/features/platform/server/http";
import { createSessionSchema, rangeQuery } from "@/features/planning/schemas";
import { createSession, listSessions } from "@/features/planning/server/planning";
import { idParam } from "@/features/platform/lib/params";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = rangeQuery.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!q.success) throw new HttpError(400, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD.", { fieldErrors: fieldErrors(q.error) });
  return json(await listSessions(actor, id, q.data.from, q.data.to));
});

export const POST = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await createSession(actor, id, await readJson(req, createSessionSchema)), { status: 201 });
});
