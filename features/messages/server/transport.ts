import "server-only";
import nodemailer from "nodemailer";
import { Resend } from "resend";
import { config } from "@/features/platform/server/config";

export interface Envelope {
  to: string;
  subject: string;
  html: string;
  text: string;
  kind: string;
  headers: Record<string, string>;
  idempotencyKey: string;
}

export type SendResult = { ok: true; providerId: string } | { ok: false; retry: boolean; error: string };

/** The sender of every message (TIDEMARK_MAIL_FROM). */
export function fromAddress(): string {
  return config().mail.from;
}

/**
 * The e-mail transport: the Resend SDK by default (pointed at the local fake of its API through the SDK's base-URL setting
 * when RESEND_BASE_URL is set, at the real service with a real RESEND_API_KEY otherwise), or SMTP through nodemailer when
 * TIDEMARK_EMAIL_TRANSPORT=smtp (SMTP_HOST, SMTP_PORT).
 */
export async function sendEmail(e: Envelope): Promise<SendResult> {
  return config().mail.transport === "smtp" ? sendSmtp(e) : sendResend(e);
}

let resend: Resend | undefined;
let resendFor = "";

/** The SDK client for the configured service (or its local fake), or why there is none. */
function resendClient(): Resend | string {
  const { resend: settings } = config().mail;
  const baseUrl = settings.baseUrl ?? "https://api.resend.com";
  const key = settings.apiKey ?? (settings.baseUrl ? "re_local_fake_key" : "");
  if (!key) return "No RESEND_API_KEY is set and no local fake (RESEND_BASE_URL) is configured.";
  if (!resend || resendFor !== `${baseUrl} ${key}`) {
    resend = new Resend(key, { baseUrl });
    resendFor = `${baseUrl} ${key}`;
  }
  return resend;
}

const payload = (e: Envelope) => ({
  from: fromAddress(),
  to: [e.to],
  subject: e.subject,
  html: e.html,
  text: e.text,
  headers: e.headers,
  tags: [{ name: "kind", value: e.kind }],
});

/** A failed answer: unreachable (no status), rate-limited or a server error may pass later; a refusal (4xx) will not. */
function failure(error: { message?: string; statusCode?: number | null } | null): SendResult & { ok: false } {
  const status = error?.statusCode ?? null;
  const retry = status === null || status === 429 || status >= 500;
  return { ok: false, retry, error: `${status ?? "no answer"}: ${error?.message ?? "unknown error"}` };
}

async function sendResend(e: Envelope): Promise<SendResult> {
  const client = resendClient();
  if (typeof client === "string") return { ok: false, retry: false, error: client };
  const { data, error } = await client.emails.send(payload(e), { idempotencyKey: e.idempotencyKey });
  if (data?.id) return { ok: true, providerId: data.id };
  return failure(error as { message?: string; statusCode?: number | null } | null);
}

/** The most messages one batch request may hold (the service's limit). */
export const BATCH_LIMIT = 100;

/** Whether the transport sends batches (the e-mail service's batch endpoint; SMTP sends one by one). */
export function sendsBatches(): boolean {
  return config().mail.transport !== "smtp";
}

export type BatchResult =
  { ok: true; providerIds: string[] } | { ok: false; retry: boolean; error: string; conflict?: boolean };

/**
 * Sends up to BATCH_LIMIT messages in one request under one idempotency key: the same key with the same messages is
 * sent once, however often it is retried. All or nothing: the service takes the whole batch or none of it.
 */
export async function sendEmailBatch(batchKey: string, list: Envelope[]): Promise<BatchResult> {
  const client = resendClient();
  if (typeof client === "string") return { ok: false, retry: false, error: client };
  const { data, error } = await client.batch.send(list.map(payload), { idempotencyKey: batchKey });
  const ids = data?.data?.map((d) => d.id) ?? [];
  if (data && ids.length === list.length) return { ok: true, providerIds: ids };
  if (data)
    return { ok: false, retry: true, error: `the service answered ${ids.length} ids for ${list.length} messages` };
  const e = error as { message?: string; statusCode?: number | null } | null;
  // 409: the key was used before with other content. Whatever was sent then must not be sent again one by one.
  return e?.statusCode === 409 ? { ...failure(e), conflict: true } : failure(e);
}

let smtp: nodemailer.Transporter | undefined;

async function sendSmtp(e: Envelope): Promise<SendResult> {
  const s = config().mail.smtp;
  smtp ??= nodemailer.createTransport({
    host: s.host ?? "127.0.0.1",
    port: s.port,
    secure: false,
    ignoreTLS: s.host === undefined || s.host === "127.0.0.1",
    ...(s.user ? { auth: { user: s.user, pass: s.password } } : {}),
  });
  try {
    const info = await smtp.sendMail({
      from: fromAddress(),
      to: e.to,
      subject: e.subject,
      html: e.html,
      text: e.text,
      headers: { ...e.headers, "X-Tidemark-Kind": e.kind, "X-Tidemark-Idempotency-Key": e.idempotencyKey },
    });
    return { ok: true, providerId: info.messageId };
  } catch (err) {
    const code = (err as { responseCode?: number }).responseCode;
    return {
      ok: false,
      retry: code === undefined || (code >= 400 && code < 500),
      error: err instanceof Error ? err.message : String(err),
    };
  }
}
