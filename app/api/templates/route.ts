import { z } from "zod";
import { requireActor } from "@/features/access/server/permissions";
import { json, parseQuery, readJson, route } from "@/features/platform/server/http";
import { templateSchema } from "@/features/planning/schemas";
import { createTemplate, duplicateTemplate, listTemplates } from "@/features/planning/server/templates";

const query = z.object({ squad: z.string().min(1).max(100).optional(), q: z.string().max(80).optional() });

export const GET = route(async (req) => {
  const actor = await requireActor(req.headers);
  const q = parseQuery(req, query, "Use ?squad=<id> and ?q=<search text>.");
  return json(await listTemplates(actor, { squadId: q.squad, q: q.q }));
});

const duplicate = z.object({ copyOf: z.string().min(1).max(100) }).strict();

export const POST = route(async (req) => {
  const actor = await requireActor(req.headers);
  const body = await readJson(
    req,
    z.union([duplicate, templateSchema], { error: "Send a template, or {copyOf: id} to duplicate one." }),
  );
  return json("copyOf" in body ? await duplicateTemplate(actor, body.copyOf) : await createTemplate(actor, body), {
    status: 201,
  });
});
