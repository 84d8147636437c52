import { requireActor } from "@/features/access/server/permissions";
import { json, route } from "@/features/platform/server/http";
import { describeMe } from "@/features/squads/server/squads";

export const GET = route(async (req) => {
  const actor = await requireActor(req.headers);
  return json(await describeMe(actor));
});
