import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { updateUnits } from "@/features/auth/server";
import { UNIT_SYSTEMS } from "@/features/platform/lib/units";
import { json, readJson, route } from "@/features/platform/server/http";

/** GET: the person's display settings ({units}). */
export const GET = route(async (req) => json({ units: (await requireActor(req.headers)).units }));

/** PATCH {units}: metric or imperial, for every number this person reads (pages, e-mails, downloads). */
export const PATCH = route(async (req) => {
  const actor = await requireActor(req.headers);
  const body = await readJson(
    req,
    z.object({ units: z.enum(UNIT_SYSTEMS, { error: "Choose metric or imperial." }) }).strict(),
  );
  return json(await updateUnits(actor, body.units));
});
