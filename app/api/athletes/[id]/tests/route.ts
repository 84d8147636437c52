import { requireActor } from "@/features/access/server/permissions";
import { jsonTestSchema, MAX_UPLOAD_BYTES, uploadFieldsSchema } from "@/features/athlete-tests/schemas";
import { createGasExchangeTest, createJsonTest, listTests } from "@/features/athlete-tests/server/tests";
import {
  fieldErrors,
  HttpError,
  json,
  jsonField,
  parseParams,
  readJson,
  readUpload,
  route,
} from "@/features/platform/server/http";
import { idParam } from "@/features/platform/lib/params";

export const GET = route<RouteContext<"/api/athletes/[id]/tests">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  return json(await listTests(actor, id));
});

export const POST = route<RouteContext<"/api/athletes/[id]/tests">>(async (req, ctx) => {
  const actor = await requireActor(req.headers);
  const { id } = parseParams(await ctx.params, idParam);
  const type = req.headers.get("content-type") ?? "";
  if (type.startsWith("multipart/form-data")) {
    const { file, form } = await readUpload(req, {
      maxBytes: MAX_UPLOAD_BYTES,
      tooLarge: "The file is larger than 10 MB. Export a shorter file or averaged data.",
      missing: "Attach the test file in the field named file.",
      missingField: "Choose a CSV file.",
    });
    if (file.bytes.length === 0)
      throw new HttpError(400, "The file is empty.", { fieldErrors: { file: ["The file is empty."] } });
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
    if (!fields.success)
      throw new HttpError(400, "Some fields are not valid.", { fieldErrors: fieldErrors(fields.error) });
    const created = await createGasExchangeTest(actor, id, fields.data, file);
    return json(created, { status: 201 });
  }
  if (!type.startsWith("application/json")) {
    throw new HttpError(
      415,
      "Send a gas-exchange file as multipart/form-data, or a talk test, submaximal estimate or thresholds as JSON.",
    );
  }
  const body = await readJson(req, jsonTestSchema);
  return json(await createJsonTest(actor, id, body), { status: 201 });
});
