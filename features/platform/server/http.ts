import "server-only";
import { z, ZodError } from "zod";
import { publicOrigin } from "./origin";

/** An error that answers the request with this status and message. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const notFound = (what = "Not found") => new HttpError(404, what);
export const unauthenticated = () => new HttpError(401, "Please sign in.");
export const forbidden = (why = "You do not have access to this.") => new HttpError(403, why);

/** Someone else changed the record since the client read it: 409 with the current state, so the client can show it. */
export const editConflict = (current: unknown, what = "this") =>
  new HttpError(
    409,
    `Someone else changed ${what} since you opened it. The current version is shown; make your change again if it is still needed.`,
    { current },
  );

export function json(body: unknown, init: ResponseInit = {}): Response {
  return Response.json(body, init);
}

/** Field errors keyed by dotted path, e.g. {"bodyMassKg": ["Must be between 20 and 300 kg"]}. */
export function fieldErrors(error: ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

const MAX_JSON_BYTES = 64 * 1024;

/** Reads a JSON body and validates it; answers 400 with field errors on bad input. */
export async function readJson<T extends z.ZodType>(req: Request, schema: T): Promise<z.infer<T>> {
  const length = Number(req.headers.get("content-length") ?? 0);
  if (length > MAX_JSON_BYTES) throw new HttpError(413, `The request body is larger than ${MAX_JSON_BYTES / 1024} KB.`);
  const raw = await req.text();
  if (raw.length > MAX_JSON_BYTES)
    throw new HttpError(413, `The request body is larger than ${MAX_JSON_BYTES / 1024} KB.`);
  let data: unknown;
  try {
    data = raw.length ? JSON.parse(raw) : undefined;
  } catch {
    throw new HttpError(400, "The request body is not valid JSON.");
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) {
    throw new HttpError(400, "Some fields are not valid.", { fieldErrors: fieldErrors(parsed.error) });
  }
  return parsed.data;
}

/** The search parameters of a request through a zod schema; 400 with field errors when they do not fit. */
export function parseQuery<T extends z.ZodType>(
  req: Request,
  schema: T,
  message = "Some query parameters are not valid.",
): z.infer<T> {
  const parsed = schema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!parsed.success) throw new HttpError(400, message, { fieldErrors: fieldErrors(parsed.error) });
  return parsed.data;
}

export interface UploadLimits {
  maxBytes: number;
  /** Said when the file is too large, e.g. "The file is larger than 10 MB." */
  tooLarge: string;
  /** Said when no file is attached (the field is named `file`). */
  missing: string;
  /** The field error shown beside the file input when none is attached. */
  missingField: string;
}

/**
 * One reader for file uploads (multipart/form-data, the file in the field `file`): refuses other content types (415),
 * too large a body before reading it and too large a file after (413), a form that cannot be read (400), a missing file
 * (400). Gives the file's bytes and the other fields.
 */
export async function readUpload(
  req: Request,
  limits: UploadLimits,
): Promise<{ file: { name: string; type: string; bytes: Uint8Array }; form: FormData }> {
  if (!(req.headers.get("content-type") ?? "").startsWith("multipart/form-data"))
    throw new HttpError(415, "Send the file as multipart/form-data in the field named file.");
  const length = Number(req.headers.get("content-length") ?? 0);
  if (length > limits.maxBytes + 64 * 1024) throw new HttpError(413, limits.tooLarge);
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new HttpError(400, "The upload could not be read as a form with a file.");
  }
  const file = form.get("file");
  if (!(file instanceof File))
    throw new HttpError(400, limits.missing, { fieldErrors: { file: [limits.missingField] } });
  if (file.size > limits.maxBytes) throw new HttpError(413, limits.tooLarge);
  return { file: { name: file.name, type: file.type, bytes: new Uint8Array(await file.arrayBuffer()) }, form };
}

/** A form field holding JSON, or undefined when it is absent or empty. */
export function jsonField(form: FormData, name: string): unknown {
  const raw = form.get(name);
  if (raw === null || raw === "") return undefined;
  if (typeof raw !== "string") throw new HttpError(400, `The field ${name} must be text.`);
  try {
    return JSON.parse(raw);
  } catch {
    throw new HttpError(400, `The field ${name} is not valid JSON.`);
  }
}

export function parseParams<T extends z.ZodType>(params: unknown, schema: T): z.infer<T> {
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw notFound();
  return parsed.data;
}

// Connection failures (Node and postgres.js codes) and PostgreSQL's shutdown and connection classes (57P0x, 08xxx).
const UNAVAILABLE = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "EPIPE",
  "ETIMEDOUT",
  "CONNECTION_CLOSED",
  "CONNECTION_ENDED",
  "CONNECTION_DESTROYED",
  "CONNECT_TIMEOUT",
  "57P01",
  "57P02",
  "57P03",
  "08000",
  "08001",
  "08003",
  "08004",
  "08006",
]);

/** Whether an error, or any error it wraps (query builders and the auth library wrap the driver's), means the database is unreachable. */
export function isDatabaseUnavailable(e: unknown): boolean {
  for (let err = e, depth = 0; err && depth < 6; err = (err as { cause?: unknown }).cause, depth++) {
    const code = (err as { code?: unknown }).code;
    if (typeof code === "string" && UNAVAILABLE.has(code)) return true;
  }
  return false;
}

const WRITES = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * Cross-site request forgery: a state-changing request must come from this site's own pages. A browser names the page's
 * origin in `Origin` (or, in older cases, says `Sec-Fetch-Site`); a foreign one is refused with 403. A request that sends
 * neither is not a browser's cross-site request (a script or a mail program) and passes. The body must be JSON or multipart:
 * the forms another site can post without asking (text/plain, url-encoded) answer 415.
 */
export function checkSameOrigin(req: Request): void {
  if (!WRITES.has(req.method)) return;
  const origin = req.headers.get("origin");
  if (origin !== null) {
    const own = new Set([publicOrigin(), new URL(req.url).origin]);
    if (!own.has(origin)) throw new HttpError(403, "This request came from another site and was refused.");
  } else {
    const site = req.headers.get("sec-fetch-site");
    if (site !== null && site !== "same-origin")
      throw new HttpError(403, "This request came from another site and was refused.");
  }
  // A body is typed by its sender: a browser always sends a Content-Type with one (text/plain for a bare string, a form's
  // own type for a form). Without a body there is nothing to type.
  const type = (req.headers.get("content-type") ?? "").split(";")[0]!.trim().toLowerCase();
  const hasBody =
    type !== "" || Number(req.headers.get("content-length") ?? 0) > 0 || req.headers.has("transfer-encoding");
  if (hasBody && type !== "application/json" && type !== "multipart/form-data") {
    throw new HttpError(
      415,
      "Send the request body as JSON (Content-Type: application/json) or as multipart/form-data.",
    );
  }
}

export interface RouteOptions {
  /** The route is meant to be called from elsewhere (RFC 8058 one-click unsubscribe) and acts on a signed token only. */
  crossSite?: boolean;
}

/** Wraps a route handler: known errors become their status, the database being down becomes 503, the rest 500. */
export function route<C>(handler: (req: Request, ctx: C) => Promise<Response>, options: RouteOptions = {}) {
  return async (req: Request, ctx: C): Promise<Response> => {
    try {
      if (!options.crossSite) checkSameOrigin(req);
      return await handler(req, ctx);
    } catch (e) {
      if (e instanceof HttpError) return json({ error: e.message, ...e.details }, { status: e.status });
      if (isDatabaseUnavailable(e)) {
        return json(
          { error: "The database is unavailable; please retry shortly." },
          { status: 503, headers: { "Retry-After": "5" } },
        );
      }
      console.error(e);
      return json({ error: "Something went wrong on our side." }, { status: 500 });
    }
  };
}
