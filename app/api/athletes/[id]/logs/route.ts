import { requireActor } from "@/features/access/server/permissions";
import { unplannedLogSchema } from "@/features/logs/schemas";
import { listLogs, logUnplannedSession } from "@/features/logs/server/logs";
import { fieldErrors, HttpError, json, parseParams, readJson, route } from "@/features/platform/server/http";
import { rangeQuery } from "@/features/planning/schemas";
import { idParam } from "@/features/platform/lib/params";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const q = rangeQuery.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!q.success) throw new HttpError(400, "Give ?from=YYYY-MM-DD&to=YYYY-MM-DD.", { fieldErrors: fieldErrors(q.error) });
  return json(await listLogs(actor, id, q.data.from, q.data.to));
});

/** Logs an unplanned session; a repeated submit with the same clientKey returns the first log with 200. */
export const POST = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { log, created } = await logUnplannedSession(actor, id, await readJson(req, unplannedLogSchema));
  return json({ ...log, alreadyLogged: !created }, { status: created ? 201 : 200 });
});
