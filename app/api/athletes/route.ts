import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { json, parseQuery, route } from "@/features/platform/server/http";
import { listVisibleAthletes } from "@/features/squads/server/squads";

const query = z.object({ squad: z.string().min(1).max(100).optional() });

export const GET = route(async (req) => {
  const actor = await requireActor(req.headers);
  const parsed = parseQuery(req, query, "The query is not valid: use ?squad=<squad id>.");
  return json(await listVisibleAthletes(actor, parsed.squad));
});
