import { getDb, schema } from "@/db/client";
import { requireActor } from "@/features/access/server/permissions";
import { config } from "@/features/platform/server/config";
import { json, notFound, route } from "@/features/platform/server/http";

/**
 * The soak's floor (`npm run soak`, with TIDEMARK_SOAK_FLOOR=1): one insert in one transaction on the app's own pool and
 * nothing else (no session check, no triggers, no cache), so that the soak can compare real writes with it. Without the
 * setting it is an unknown route to everyone (and asks anonymous callers to sign in first, as every API route does).
 */
export const POST = route(async (req) => {
  if (!config().soakFloor) {
    await requireActor(req.headers);
    throw notFound("Not found.");
  }
  await getDb().transaction((tx) => tx.insert(schema.soakFloor).values({}));
  return json({ ok: true }, { status: 201 });
});
