import { requireActor } from "@/features/access/server/permissions";
import { jsonTestSchema, MAX_UPLOAD_BYTES, uploadFieldsSchema } from "@/features/athlete-tests/schemas";
import { createGasExchangeTest, createJsonTest, listTests } from "@/features/athlete-tests/server/tests";
import { fieldErrors, HttpError, json, parseParams, readJson, route } from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await listTests(actor, id));
});

function jsonField(form: FormData, name: string): unknown {
  const raw = form.get(name);
  if (raw === null || raw === "") return undefined;
  if (typeof raw !== "string") throw new HttpError(400, `The field ${name} must be text.`);
  try {
    return JSON.parse(raw);
  } catch {
    throw new HttpError(400, `The field ${name} is not valid JSON.`);
  }
}

export const POST = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const type = req.headers.get("content-type") ?? "";
  if (type.startsWith("multipart/form-data")) {
    const length = Number(req.headers.get("content-length") ?? 0);
    if (length > MAX_UPLOAD_BYTES + 64 * 1024) throw new HttpError(413, "The file is larger than 10 MB. Export a shorter file or averaged data.");
    let form: FormData;
    try {
      form = await req.formData();
    } catch {
      throw new HttpError(400, "The upload could not be read as a form with a file.");
    }
    const file = form.get("file");
    if (!(file instanceof File)) throw new HttpError(400, "Attach the test file in the field named file.", { fieldErrors: { file: ["Choose a CSV file."] } });
    if (file.size > MAX_UPLOAD_BYTES) throw new HttpError(413, "The file is larger than 10 MB. Export a shorter file or averaged data.");
    if (file.size === 0) throw new HttpError(400, "The file is empty.", { fieldErrors: { file: ["The file is empty."] } });
    const mass = form.get("bodyMassKg");
    const fields = uploadFieldsSchema.safeParse({
      sport: form.get("sport"),
      protocol: form.get("protocol"),
      date: form.get("date"),
      endedBy: form.get("endedBy"),
      stopSign: form.get("stopSign") || null,
      mapping: jsonField(form, "mapping"),
      bodyMassKg: mass === null || mass === "" ? null : Number(mass),
      fiveZones: form.get("fiveZones") === "true",
      units: jsonField(form, "units"),
      segment: jsonField(form, "segment"),
      sheet: form.get("sheet") || null,
    });
    if (!fields.success) throw new HttpError(400, "Some fields are not valid.", { fieldErrors: fieldErrors(fields.error) });
    const bytes = new Uint8Array(await file.arrayBuffer());
    const created = await createGasExchangeTest(actor, id, fields.data, { name: file.name, type: file.type, bytes });
    return json(created, { status: 201 });
  }
  if (!type.startsWith("application/json")) {
    throw new HttpError(415, "Send a gas-exchange file as multipart/form-data, or a talk test, submaximal estimate or thresholds as JSON.");
  }
  const body = await readJson(req, jsonTestSchema);
  return json(await createJsonTest(actor, id, body), { status: 201 });
});
