import "server-only";
import { z, ZodError } from "zod";

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
  if (raw.length > MAX_JSON_BYTES) throw new HttpError(413, `The request body is larger than ${MAX_JSON_BYTES / 1024} KB.`);
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
export function parseQuery<T extends z.ZodType>(req: Request, schema: T, message = "Some query parameters are not valid."): z.infer<T> {
  const parsed = schema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!parsed.success) throw new HttpError(400, message, { fieldErrors: fieldErrors(parsed.error) });
  return parsed.data;
}

export function parseParams<T extends z.ZodType>(params: unknown, schema: T): z.infer<T> {
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw notFound();
  return parsed.data;
}

// Connection failures (Node and postgres.js codes) and PostgreSQL's shutdown and connection classes (57P0x, 08xxx).
const UNAVAILABLE = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "CONNECTION_CLOSED", "CONNECTION_ENDED", "CONNECTION_DESTROYED", "CONNECT_TIMEOUT", "57P01", "57P02", "57P03", "08000", "08001", "08003", "08004", "08006"]);

/** Whether an error, or any error it wraps (query builders and the auth library wrap the driver's), means the database is unreachable. */
export function isDatabaseUnavailable(e: unknown): boolean {
  for (let err = e, depth = 0; err && depth < 6; err = (err as { cause?: unknown }).cause, depth++) {
    const code = (err as { code?: unknown }).code;
    if (typeof code === "string" && UNAVAILABLE.has(code)) return true;
  }
  return false;
}

/** Wraps a route handler: known errors become their status, the database being down becomes 503, the rest 500. */
export function route<C>(handler: (req: Request, ctx: C) => Promise<Response>) {
  return async (req: Request, ctx: C): Promise<Response> => {
    try {
      return await handler(req, ctx);
    } catch (e) {
      if (e instanceof HttpError) return json({ error: e.message, ...e.details }, { status: e.status });
      if (isDatabaseUnavailable(e)) {
        return json({ error: "The database is unavailable; please retry shortly." }, { status: 503, headers: { "Retry-After": "5" } });
      }
      console.error(e);
      return json({ error: "Something went wrong on our side." }, { status: 500 });
    }
  };
}
