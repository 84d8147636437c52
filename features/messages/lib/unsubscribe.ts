/**
 * Unsubscribe tokens: which account turns off which kind of message, signed with the server's secret (HMAC-SHA-256), so a
 * link works without signing in and cannot be forged for another account or kind.
 */
import { createHmac, timingSafeEqual } from "node:crypto";

export const UNSUBSCRIBABLE = ["session_reminder", "retest_reminder", "coach_digest", "thread_message"] as const;
export type UnsubscribableKind = (typeof UNSUBSCRIBABLE)[number];

export const KIND_LABELS: Record<UnsubscribableKind, string> = {
  session_reminder: "session reminders",
  retest_reminder: "retest reminders",
  coach_digest: "the weekly coach digest",
  thread_message: "e-mails about new messages",
};

const b64 = (s: string) => Buffer.from(s, "utf8").toString("base64url");

function mac(secret: string, userId: string, kind: string): string {
  return createHmac("sha256", secret).update(`unsubscribe:${userId}:${kind}`).digest("base64url");
}

export function unsubscribeToken(secret: string, userId: string, kind: UnsubscribableKind): string {
  return `${b64(userId)}.${kind}.${mac(secret, userId, kind)}`;
}

export function readUnsubscribeToken(
  secret: string,
  token: string,
): { userId: string; kind: UnsubscribableKind } | null {
  const parts = token.split(".");
  if (parts.length !== 3) return null;
  const [u, kind, sig] = parts as [string, string, string];
  if (!(UNSUBSCRIBABLE as readonly string[]).includes(kind)) return null;
  let userId: string;
  try {
    userId = Buffer.from(u, "base64url").toString("utf8");
  } catch {
    return null;
  }
  const expected = Buffer.from(mac(secret, userId, kind));
  const given = Buffer.from(sig);
  if (expected.length !== given.length || !timingSafeEqual(expected, given)) return null;
  return { userId, kind: kind as UnsubscribableKind };
}
