/**
 * A local fake of the e-mail service for development and tests: the HTTP endpoints the Resend SDK calls to send,
 * batch-send and fetch a message (answering with ids and the service's error shapes, honouring its Idempotency-Key
 * header, 429 or 5xx when told to), an SMTP catcher (smtp-server) for the nodemailer transport, and an outbox of what
 * arrived: a page (list and message view, HTML and text) and `GET /outbox.json` (newest first) for tests.
 * Control for tests: `POST /_fake/fail {"status": 429|503, "count"?: n, "forMs"?: ms, "afterSending"?: true}` (with
 * afterSending the message is taken but the answer is an error, as when it is lost) and `POST /_fake/reset`.
 * Run alone: `tsx scripts/fake-email.ts` (FAKE_EMAIL_PORT, default 4010; FAKE_SMTP_PORT, default 2525).
 */
import { randomUUID } from "node:crypto";
import http from "node:http";
import type { AddressInfo } from "node:net";
import PostalMime from "postal-mime";
import { SMTPServer } from "smtp-server";

export interface FakeMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  html: string;
  text: string;
  headers: Record<string, string>;
  kind: string;
  via: "api" | "smtp";
  createdAt: string;
}

export interface FakeEmail {
  url: string;
  smtpPort: number;
  messages: FakeMessage[];
  stop(): Promise<void>;
}

const esc = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

function page(title: string, body: string): string {
  return `<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)} · local e-mail outbox</title>
<style>body{font-family:system-ui,sans-serif;margin:0;background:#f7f4ee;color:#1f2a33;line-height:1.5}main{max-width:60rem;margin:0 auto;padding:1.5rem}
table{width:100%;border-collapse:collapse;background:#fff}td,th{overflow-wrap:anywhere;padding:.4rem .6rem;border-bottom:1px solid #ddd6c9;text-align:left;font-variant-numeric:tabular-nums}
a{color:#0f5e63}pre{white-space:pre-wrap;background:#fff;padding:1rem;border:1px solid #ddd6c9}iframe{width:100%;height:32rem;border:1px solid #ddd6c9;background:#fff}
.note{color:#5b6770;font-size:.9rem}</style></head><body><main>${body}</main></body></html>`;
}

function json(res: http.ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}) {
  res.writeHead(status, { "content-type": "application/json", ...headers });
  res.end(JSON.stringify(body));
}

async function readBody(req: http.IncomingMessage, limit = 2_000_000): Promise<string> {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const c of req) {
    size += (c as Buffer).length;
    if (size > limit) throw Object.assign(new Error("too large"), { status: 413 });
    chunks.push(c as Buffer);
  }
  return Buffer.concat(chunks).toString("utf8");
}

type Payload = {
  from?: unknown;
  to?: unknown;
  subject?: unknown;
  html?: unknown;
  text?: unknown;
  headers?: unknown;
  tags?: unknown;
};

/** The service's validation, in its error shape ({statusCode, name, message}). */
function validate(p: Payload): { statusCode: number; name: string; message: string } | null {
  if (typeof p.from !== "string" || !p.from)
    return { statusCode: 422, name: "missing_required_field", message: "Missing `from` field." };
  const to = typeof p.to === "string" ? [p.to] : p.to;
  if (
    !Array.isArray(to) ||
    to.length === 0 ||
    !to.every((x) => typeof x === "string" && /^[^@\s<>]+@[^@\s<>]+$/.test(x.replace(/^.*<|>$/g, "")))
  ) {
    return {
      statusCode: 422,
      name: "validation_error",
      message:
        "Invalid `to` field. The email address needs to follow the `email@example.com` or `Name <email@example.com>` format.",
    };
  }
  if (typeof p.subject !== "string" || !p.subject)
    return { statusCode: 422, name: "missing_required_field", message: "Missing `subject` field." };
  if (typeof p.html !== "string" && typeof p.text !== "string")
    return { statusCode: 422, name: "validation_error", message: "Either `html` or `text` must be provided." };
  return null;
}

export async function startFakeEmail(
  opts: { port?: number; smtpPort?: number; quiet?: boolean } = {},
): Promise<FakeEmail> {
  const messages: FakeMessage[] = [];
  const byKey = new Map<string, { body: string; id: string }>();
  let failure: { status: number; count: number | null; until: number | null; afterSending: boolean } | null = null;

  const store = (p: Payload, via: FakeMessage["via"]): FakeMessage => {
    const tags = Array.isArray(p.tags) ? (p.tags as { name?: string; value?: string }[]) : [];
    const headers = (p.headers && typeof p.headers === "object" ? p.headers : {}) as Record<string, string>;
    const m: FakeMessage = {
      id: randomUUID(),
      from: String(p.from),
      to: typeof p.to === "string" ? [p.to] : (p.to as string[]),
      subject: String(p.subject),
      html: typeof p.html === "string" ? p.html : "",
      text: typeof p.text === "string" ? p.text : "",
      headers,
      kind: tags.find((t) => t.name === "kind")?.value ?? headers["X-Tidemark-Kind"] ?? "",
      via,
      createdAt: new Date().toISOString(),
    };
    messages.push(m);
    return m;
  };

  /** Whether the fake was told to fail this request; counts the failure down. */
  const failing = (): number | null => {
    if (!failure) return null;
    if (failure.until !== null && Date.now() > failure.until) {
      failure = null;
      return null;
    }
    if (failure.count !== null) {
      if (failure.count <= 0) {
        failure = null;
        return null;
      }
      failure.count--;
    }
    return failure.status;
  };

  const server = http.createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? "/", "http://localhost");
      const path = url.pathname;
      if (req.method === "POST" && path === "/_fake/fail") {
        const b = JSON.parse((await readBody(req)) || "{}") as {
          status?: number;
          count?: number;
          forMs?: number;
          afterSending?: boolean;
        };
        failure = {
          status: b.status ?? 503,
          count: b.count ?? null,
          until: b.forMs ? Date.now() + b.forMs : null,
          afterSending: b.afterSending === true,
        };
        return json(res, 200, { ok: true });
      }
      if (req.method === "POST" && path === "/_fake/reset") {
        failure = null;
        messages.length = 0;
        byKey.clear();
        return json(res, 200, { ok: true });
      }
      if (path === "/favicon.ico") return void res.writeHead(204).end();
      if (req.method === "GET" && path === "/outbox.json") {
        return json(
          res,
          200,
          [...messages]
            .reverse()
            .map((m) => ({ id: m.id, to: m.to, subject: m.subject, kind: m.kind, createdAt: m.createdAt })),
        );
      }
      if (req.method === "GET" && (path === "/" || path === "/outbox")) {
        const rows = [...messages]
          .reverse()
          .map(
            (m) =>
              `<tr><td>${esc(m.createdAt.replace("T", " ").slice(0, 19))} UTC</td><td>${esc(m.kind || "–")}</td><td>${esc(m.to.join(", "))}</td><td><a href="/outbox/${m.id}">${esc(m.subject)}</a></td><td>${m.via}</td></tr>`,
          );
        return void res.writeHead(200, { "content-type": "text/html; charset=utf-8" }).end(
          page(
            "Outbox",
            `<h1>Local e-mail outbox</h1><p class="note">Messages Tidemark sent to the local fake of the e-mail service (nothing leaves this machine). Newest first.</p>
${rows.length ? `<table><thead><tr><th>Received</th><th>Kind</th><th>To</th><th>Subject</th><th>Via</th></tr></thead><tbody>${rows.join("")}</tbody></table>` : "<p>No messages yet.</p>"}`,
          ),
        );
      }
      const view = /^\/outbox\/([\w-]+)$/.exec(path);
      if (req.method === "GET" && view) {
        const m = messages.find((x) => x.id === view[1]);
        if (!m)
          return void res
            .writeHead(404, { "content-type": "text/html; charset=utf-8" })
            .end(page("Not found", `<p>No such message. <a href="/outbox">Back to the outbox</a></p>`));
        const headers = Object.entries(m.headers)
          .map(([k, v]) => `<tr><th>${esc(k)}</th><td>${esc(v)}</td></tr>`)
          .join("");
        return void res.writeHead(200, { "content-type": "text/html; charset=utf-8" }).end(
          page(
            m.subject,
            `<p><a href="/outbox">← Outbox</a></p><h1>${esc(m.subject)}</h1><table><tbody><tr><th>From</th><td>${esc(m.from)}</td></tr><tr><th>To</th><td>${esc(m.to.join(", "))}</td></tr><tr><th>Kind</th><td>${esc(m.kind || "–")}</td></tr>${headers}</tbody></table>
<h2>HTML part</h2><iframe sandbox="" title="HTML part" srcdoc="${esc(m.html)}"></iframe><h2>Text part</h2><pre>${esc(m.text)}</pre>`,
          ),
        );
      }
      // The service's API.
      if (path.startsWith("/emails")) {
        if (!/^Bearer \S+/.test(req.headers.authorization ?? ""))
          return json(res, 401, {
            statusCode: 401,
            name: "missing_api_key",
            message: "Missing API key in the authorization header.",
          });
        // "afterSending": the message is taken (and kept under its idempotency key), but the answer is an error, as when
        // the answer is lost on the way back.
        const afterSending = failure?.afterSending === true;
        const failed = req.method === "POST" ? failing() : null;
        const fail = afterSending ? null : failed;
        const answer = (status: number, body: unknown) =>
          afterSending && failed
            ? json(res, failed, { statusCode: failed, name: "application_error", message: "The answer was lost." })
            : json(res, status, body);
        if (fail === 429)
          return json(
            res,
            429,
            {
              statusCode: 429,
              name: "rate_limit_exceeded",
              message: "Too many requests. You can only make 2 requests per second.",
            },
            { "retry-after": "1" },
          );
        if (fail)
          return json(res, fail, {
            statusCode: fail,
            name: "application_error",
            message: "The service is unavailable.",
          });
        if (req.method === "POST" && path === "/emails") {
          const raw = await readBody(req);
          let p: Payload;
          try {
            p = JSON.parse(raw) as Payload;
          } catch {
            return json(res, 422, {
              statusCode: 422,
              name: "validation_error",
              message: "The body is not valid JSON.",
            });
          }
          const key = req.headers["idempotency-key"];
          if (typeof key === "string" && key) {
            const seen = byKey.get(key);
            if (seen)
              return seen.body === raw
                ? json(res, 200, { id: seen.id })
                : json(res, 409, {
                    statusCode: 409,
                    name: "invalid_idempotent_request",
                    message: "Same idempotency key used with a different request payload.",
                  });
          }
          const invalid = validate(p);
          if (invalid) return json(res, invalid.statusCode, invalid);
          const m = store(p, "api");
          if (typeof key === "string" && key) byKey.set(key, { body: raw, id: m.id });
          return answer(200, { id: m.id });
        }
        if (req.method === "POST" && path === "/emails/batch") {
          const raw = await readBody(req);
          const batchKey = req.headers["idempotency-key"];
          if (typeof batchKey === "string" && batchKey) {
            const seen = byKey.get(`batch ${batchKey}`);
            if (seen)
              return seen.body === raw
                ? json(res, 200, { data: JSON.parse(seen.id) as { id: string }[] })
                : json(res, 409, {
                    statusCode: 409,
                    name: "invalid_idempotent_request",
                    message: "Same idempotency key used with a different request payload.",
                  });
          }
          const list = JSON.parse(raw || "[]") as Payload[];
          if (!Array.isArray(list) || list.length > 100)
            return json(res, 422, {
              statusCode: 422,
              name: "validation_error",
              message: "A batch holds 1 to 100 e-mails.",
            });
          const invalid = list.map(validate).find(Boolean);
          if (invalid) return json(res, invalid.statusCode, invalid);
          const data = list.map((p) => ({ id: store(p, "api").id }));
          // The batch's ids are kept under its key, so that a retry of the same batch answers them again.
          if (typeof batchKey === "string" && batchKey)
            byKey.set(`batch ${batchKey}`, { body: raw, id: JSON.stringify(data) });
          return answer(200, { data });
        }
        const one = /^\/emails\/([\w-]+)$/.exec(path);
        if (req.method === "GET" && one) {
          const m = messages.find((x) => x.id === one[1]);
          if (!m) return json(res, 404, { statusCode: 404, name: "not_found", message: "Email not found" });
          return json(res, 200, {
            object: "email",
            id: m.id,
            to: m.to,
            from: m.from,
            subject: m.subject,
            html: m.html,
            text: m.text,
            created_at: m.createdAt,
            last_event: "delivered",
          });
        }
      }
      json(res, 404, { statusCode: 404, name: "not_found", message: "Not found." });
    })().catch((e: { status?: number; message?: string }) =>
      json(res, e.status ?? 500, {
        statusCode: e.status ?? 500,
        name: "application_error",
        message: e.message ?? "error",
      }),
    );
  });
  await new Promise<void>((r) => server.listen(opts.port ?? 0, "127.0.0.1", r));

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    banner: "Tidemark local SMTP catcher",
    logger: false,
    onData(stream, _session, done) {
      void (async () => {
        const chunks: Buffer[] = [];
        for await (const c of stream) chunks.push(c as Buffer);
        const email = await PostalMime.parse(Buffer.concat(chunks));
        const headers: Record<string, string> = {};
        for (const h of email.headers) headers[h.originalKey ?? h.key] = h.value;
        store(
          {
            from: email.from?.address ?? "",
            to: (email.to ?? []).map((a) => a.address ?? ""),
            subject: email.subject ?? "",
            html: email.html ?? "",
            text: email.text ?? "",
            headers,
          },
          "smtp",
        );
      })().then(
        () => done(),
        (e) => done(e as Error),
      );
    },
  });
  await new Promise<void>((r) => smtp.listen(opts.smtpPort ?? 0, "127.0.0.1", r));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const smtpPort = (smtp.server.address() as AddressInfo).port;
  if (!opts.quiet)
    console.log(`[fake-email] API and outbox on ${url} (outbox: ${url}/outbox), SMTP on 127.0.0.1:${smtpPort}`);
  return {
    url,
    smtpPort,
    messages,
    stop: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => smtp.close(() => resolve()));
      }),
  };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const fake = await startFakeEmail({
    port: Number(process.env.FAKE_EMAIL_PORT ?? 4010),
    smtpPort: Number(process.env.FAKE_SMTP_PORT ?? 2525),
  });
  const stop = () => void fake.stop().then(() => process.exit(0));
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
}
