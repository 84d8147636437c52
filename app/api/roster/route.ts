import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { HttpError, json, route } from "@/features/platform/server/http";
import { squadRoster } from "@/features/roster/server/roster";

export const dynamic = "force-dynamic";

const query = z.object({ squad: z.string().min(1).max(100).optional() }).strict();

export const GET = route(async (req) => {
  const actor = await requireActor(req.headers);
  const parsed = query.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!parsed.success) throw new HttpError(400, "The query is not valid: use ?squad=<squad id>.");
  return json(await squadRoster(actor, parsed.data.squad));
});
