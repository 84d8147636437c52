import { requireActor } from "@/features/access/server/permissions";
import { MAX_ACTIVITY_BYTES } from "@/features/activities/lib/read";
import { importActivity } from "@/features/activities/server/import";
import { HttpError, json, parseParams, readUpload, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

const TOO_BIG = "The file is larger than 25 MB.";

/** Imports a FIT, TCX, GPX or CSV activity file (multipart, field `file`; optional `sessionId`). */
export const POST = route<RouteContext<"/api/athletes/[id]/activities">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const { file, form } = await readUpload(req, {
    maxBytes: MAX_ACTIVITY_BYTES,
    tooLarge: TOO_BIG,
    missing: "Attach the activity file in the field named file.",
    missingField: "Choose a FIT, TCX, GPX or CSV file.",
  });
  const sessionId = form.get("sessionId");
  if (sessionId !== null && (typeof sessionId !== "string" || sessionId.length > 100))
    throw new HttpError(400, "sessionId must be a session id.");
  const result = await importActivity(
    actor,
    id,
    { name: file.name || "activity", bytes: file.bytes },
    sessionId || undefined,
  );
  return json(result, { status: 201 });
});
