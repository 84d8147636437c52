import { requireActor } from "@/features/access/server/permissions";
import { json, readJson, route } from "@/features/platform/server/http";
import { createSquadSchema } from "@/features/squads/schemas";
import { createSquad, describeMe } from "@/features/squads/server/squads";

export const GET = route(async (req) => {
  const actor = await requireActor(req.headers);
  return json((await describeMe(actor)).squads);
});

export const POST = route(async (req) => {
  const actor = await requireActor(req.headers);
  const body = await readJson(req, createSquadSchema);
  return json(await createSquad(actor, body.name), { status: 201 });
});
