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

async function sendResend(e: Envelope): Promise<SendResult> {
  const { resend: settings } = config().mail;
  const baseUrl = settings.baseUrl ?? "https://api.resend.com";
  const key = settings.apiKey ?? (settings.baseUrl ? "re_local_fake_key" : "");
  if (!key)
    return {
      ok: false,
      retry: false,
      error: "No RESEND_API_KEY is set and no local fake (RESEND_BASE_URL) is configured.",
    };
  if (!resend || resendFor !== `${baseUrl} ${key}`) {
    resend = new Resend(key, { baseUrl });
    resendFor = `${baseUrl} ${key}`;
  }
  const { data, error } = await resend.emails.send(
    {
      from: fromAddress(),
      to: [e.to],
      subject: e.subject,
      html: e.html,
      text: e.text,
      headers: e.headers,
      tags: [{ name: "kind", value: e.kind }],
    },
    { idempotencyKey: e.idempotencyKey },
  );
  if (data?.id) return { ok: true, providerId: data.id };
  const status = (error as { statusCode?: number | null } | null)?.statusCode ?? null;
  // Unreachable (no status), rate-limited or a server error: try again later. A refused message (4xx) will not improve.
  const retry = status === null || status === 429 || status >= 500;
  return { ok: false, retry, error: `${status ?? "no answer"}: ${error?.message ?? "unknown error"}` };
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
