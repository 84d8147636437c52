import { requireActor } from "@/features/access/server/permissions";
import { logSchema } from "@/features/logs/schemas";
import { logPlannedSession } from "@/features/logs/server/logs";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

/** Logs a planned session: 201 with the new log, or 200 with the log already made (a repeated submit writes nothing). */
export const POST = route<RouteContext<"/api/sessions/[id]/log">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { log, created } = await logPlannedSession(actor, id, await readJson(req, logSchema));
  return json({ ...log, alreadyLogged: !created }, { status: created ? 201 : 200 });
});
