/** What the local outbox page may show, and when it exists at all (pure; read by app/outbox). */
const LOOPBACK = /^https?:\/\/(127\.0\.0\.1|localhost|\[::1\])(:\d+)?(\/|$)/;

/** The mail settings these rules look at (the `mail` part of the configuration, features/platform/server/config.ts). */
export interface MailSettings {
  transport: "resend" | "smtp";
  resend: { baseUrl: string | undefined };
  smtp: { host: string | undefined };
  localOutbox: boolean;
}

/** Whether messages go to the local e-mail fake (on this machine) rather than to a real e-mail service. */
export function localFakeTransport(mail: MailSettings): boolean {
  if (mail.transport === "smtp") {
    const host = mail.smtp.host ?? "127.0.0.1";
    return host === "127.0.0.1" || host === "localhost" || host === "::1";
  }
  return LOOPBACK.test(mail.resend.baseUrl ?? "https://api.resend.com");
}

/**
 * The local outbox page is an aid for site operators on a local installation: it exists only when the start or test
 * harness turned it on and the messages go to the local e-mail fake, never when real e-mail is configured.
 */
export function localOutboxEnabled(mail: MailSettings): boolean {
  return mail.localOutbox && localFakeTransport(mail);
}

/** Messages whose links open an account (reset, invitation, address confirmation): shown masked on the outbox page. */
export const ACCOUNT_MESSAGE_KINDS = new Set([
  "password_reset",
  "invitation",
  "email_verification",
  "email_change_confirmation",
  "email_change_verification",
  "managed_hand_over",
]);

/** Replaces the secret part of every link in a message's text: what is left says where the link goes, not how to use it. */
export function maskLinks(text: string): string {
  return text.replace(/\bhttps?:\/\/[^\s<>"]+/g, (url) => {
    try {
      const u = new URL(url);
      return `${u.origin}/… (link hidden; it is in the recipient's inbox)`;
    } catch {
      return "(link hidden)";
    }
  });
}
