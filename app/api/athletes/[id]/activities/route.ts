import { requireActor } from "@/features/access/server/permissions";
import { MAX_ACTIVITY_BYTES } from "@/features/activities/lib/read";
import { importActivity } from "@/features/activities/server/import";
import { HttpError, json, parseParams, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const dynamic = "force-dynamic";
type Ctx = { params: Promise<{ id: string }> };

const TOO_BIG = "The file is larger than 25 MB.";

/** Imports a FIT, TCX, GPX or CSV activity file (multipart, field `file`; optional `sessionId`). */
export const POST = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  if (!(req.headers.get("content-type") ?? "").startsWith("multipart/form-data")) throw new HttpError(415, "Send the file as multipart/form-data in the field named file.");
  const length = Number(req.headers.get("content-length") ?? 0);
  if (length > MAX_ACTIVITY_BYTES + 64 * 1024) throw new HttpError(413, TOO_BIG);
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new HttpError(400, "The upload could not be read as a form with a file.");
  }
  const file = form.get("file");
  if (!(file instanceof File)) throw new HttpError(400, "Attach the activity file in the field named file.", { fieldErrors: { file: ["Choose a FIT, TCX, GPX or CSV file."] } });
  if (file.size > MAX_ACTIVITY_BYTES) throw new HttpError(413, TOO_BIG);
  const sessionId = form.get("sessionId");
  if (sessionId !== null && (typeof sessionId !== "string" || sessionId.length > 100)) throw new HttpError(400, "sessionId must be a session id.");
  const result = await importActivity(actor, id, { name: file.name || "activity", bytes: new Uint8Array(await file.arrayBuffer()) }, sessionId || undefined);
  return json(result, { status: 201 });
});
