import { requireActor } from "@/features/access/server/permissions";
import { idParam } from "@/features/platform/lib/params";
import { json, parseParams, readJson, route } from "@/features/platform/server/http";
import { messageSchema } from "@/features/threads/lib/schemas";
import { postMessage, readThread } from "@/features/threads/server";

/** GET: the log's thread, oldest first (reading marks it read). For the athlete and their coaches; 404 otherwise. */
export const GET = route<RouteContext<"/api/logs/[id]/messages">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await readThread(actor, { kind: "log", id }));
});

/** POST {body}: a message on the log's thread; the other readers get an e-mail unless they turned it off. */
export const POST = route<RouteContext<"/api/logs/[id]/messages">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { body } = await readJson(req, messageSchema);
  return json(await postMessage(actor, { kind: "log", id }, body), { status: 201 });
});
