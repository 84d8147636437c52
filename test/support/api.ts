/**
 * Calls the app's route handlers in-process, as a browser would: same URLs, JSON bodies and the session cookie.
 */
import * as authRoute from "@/app/api/auth/[...all]/route";
import { query } from "./db";

export const ORIGIN = process.env.BETTER_AUTH_URL ?? "http://127.0.0.1:3999";

type Handler = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
type RouteModule = Partial<Record<"GET" | "POST" | "PATCH" | "PUT" | "DELETE", unknown>>;

export interface CallOptions {
  body?: unknown;
  rawBody?: string;
  form?: FormData;
  params?: Record<string, string>;
  headers?: Record<string, string>;
  query?: string;
}

let clients = 0;

export class Browser {
  cookie = "";

  /** Each test browser is its own client address (TEST-NET-2/3 ranges) unless one is given. */
  constructor(readonly ip = `198.18.${Math.floor(++clients / 250) % 250}.${(clients % 250) + 1}`) {}

  async call(mod: RouteModule, method: keyof RouteModule, path: string, opts: CallOptions = {}) {
    const handler = mod[method] as Handler | undefined;
    if (!handler) throw new Error(`${method} is not exported for ${path}`);
    const headers: Record<string, string> = { origin: ORIGIN, "x-forwarded-for": this.ip, ...opts.headers };
    if (this.cookie) headers.cookie = this.cookie;
    // A header given as "" is left out (e.g. a request without Origin).
    for (const [k, v] of Object.entries(headers)) if (v === "") delete headers[k];
    let body: BodyInit | undefined;
    if (opts.form) {
      // Serialise the form once, so that the multipart boundary and length are set as a browser would.
      const probe = new Request(ORIGIN, { method: "POST", body: opts.form });
      headers["content-type"] = probe.headers.get("content-type")!;
      const bytes = new Uint8Array(await probe.arrayBuffer());
      headers["content-length"] = String(bytes.length);
      body = bytes;
    } else if (opts.rawBody !== undefined) body = opts.rawBody;
    else if (opts.body !== undefined) body = JSON.stringify(opts.body);
    if (body !== undefined && !opts.form) headers["content-type"] ??= "application/json";
    const req = new Request(`${ORIGIN}${path}${opts.query ?? ""}`, { method, headers, body });
    const res = await handler(req, { params: Promise.resolve(opts.params ?? {}) });
    const setCookies = res.headers.getSetCookie();
    for (const c of setCookies) this.absorbCookie(c);
    // The body's bytes (a workbook or a FIT file), and as text for everything else.
    const bytes = new Uint8Array(await res.arrayBuffer());
    const text = new TextDecoder().decode(bytes);
    let json: unknown = undefined;
    try {
      json = text ? JSON.parse(text) : undefined;
    } catch {
      json = text;
    }
    return { status: res.status, json: json as any, headers: res.headers, bytes }; // eslint-disable-line @typescript-eslint/no-explicit-any
  }

  private absorbCookie(setCookie: string) {
    const [pair] = setCookie.split(";");
    if (!pair) return;
    const [name, ...rest] = pair.split("=");
    const value = rest.join("=");
    const jar = new Map(
      this.cookie ? this.cookie.split("; ").map((c) => [c.split("=")[0]!, c.slice(c.indexOf("=") + 1)]) : [],
    );
    if (value === "" || /max-age=0/i.test(setCookie)) jar.delete(name!.trim());
    else jar.set(name!.trim(), value);
    this.cookie = [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  auth(method: "GET" | "POST", path: string, body?: unknown) {
    return this.call(authRoute, method, `/api/auth${path}`, { body });
  }

  /** Signs up and, unless told not to, confirms the address with the link from the outbox (which signs in). */
  async signUp(name: string, email: string, password = "correct-horse-battery", opts: { verify?: boolean } = {}) {
    const r = await this.auth("POST", "/sign-up/email", { name, email, password });
    if (r.status !== 200) throw new Error(`sign-up failed: ${r.status} ${JSON.stringify(r.json)}`);
    if (opts.verify !== false) {
      const v = await this.verifyEmail(email);
      if (v.status >= 400) throw new Error(`verification failed: ${v.status} ${JSON.stringify(v.json)}`);
    }
    return r.json.user as { id: string; email: string; name: string };
  }

  /** Opens the newest verification link queued for this address. */
  async verifyEmail(email: string) {
    const rows = await query<{ meta: { url: string } }>(
      `select meta from outbox where kind = 'email_verification' and lower(to_address) = lower($1) order by created_at desc limit 1`,
      [email],
    );
    if (!rows[0]) throw new Error(`no verification message for ${email}`);
    const url = new URL(rows[0].meta.url);
    return this.call(authRoute, "GET", url.pathname, { query: url.search });
  }

  async signIn(email: string, password = "correct-horse-battery") {
    return this.auth("POST", "/sign-in/email", { email, password });
  }
}
