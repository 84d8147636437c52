import "server-only";

/**
 * A short in-process memory of sessions better-auth has already verified, keyed by the exact auth cookies a request
 * carries. Verifying a session costs two HMAC checks and a database lookup; a planner page fires several API calls a
 * second, so each process remembers a verified session for at most SESSION_MEMO_MS (and never past the session's own
 * expiry). Only sessions that were found are remembered, so made-up cookies cost a lookup each and take no memory.
 *
 * Revocation: signing out, a password reset, a changed or deleted account forget the affected entries at once in the
 * process that handled them (see the database hooks in auth.ts); another process honours a revoked session for at most
 * SESSION_MEMO_MS more. What a user may see and change (squad memberships) is never remembered: it is read on every request.
 */

export const SESSION_MEMO_MS = 30_000;
const MAX_ENTRIES = 5_000;

interface Entry<T> {
  userId: string;
  token: string;
  value: T;
  until: number;
}

const entries = new Map<string, Entry<unknown>>();

/** The better-auth cookies of a request (session token, cached session data, "don't remember me"), or null without a session token. */
export function sessionCookieKey(headers: Headers): string | null {
  const cookie = headers.get("cookie");
  if (!cookie) return null;
  const parts: string[] = [];
  let hasToken = false;
  for (const piece of cookie.split(";")) {
    const p = piece.trim();
    const eq = p.indexOf("=");
    if (eq < 0) continue;
    const name = p.slice(0, eq);
    if (!/^(?:__Secure-)?better-auth\./.test(name)) continue;
    if (name.endsWith(".session_token") && eq < p.length - 1) hasToken = true;
    parts.push(p);
  }
  return hasToken ? parts.sort().join("; ") : null;
}

export function recallSession<T>(key: string, now = Date.now()): T | undefined {
  const e = entries.get(key);
  if (!e) return undefined;
  if (e.until <= now) {
    entries.delete(key);
    return undefined;
  }
  return e.value as T;
}

export function rememberSession<T>(key: string, value: T, who: { userId: string; token: string; expiresAt: Date | string | number }, now = Date.now()): void {
  const until = Math.min(now + SESSION_MEMO_MS, new Date(who.expiresAt).getTime());
  if (!(until > now)) return;
  if (entries.size >= MAX_ENTRIES) {
    // Drop the oldest tenth (a Map iterates in insertion order).
    let n = Math.ceil(MAX_ENTRIES / 10);
    for (const k of entries.keys()) {
      entries.delete(k);
      if (--n === 0) break;
    }
  }
  entries.delete(key);
  entries.set(key, { userId: who.userId, token: who.token, value, until });
}

/** Forget every remembered session of a user (account changed, password reset, account deleted). */
export function forgetUserSessions(userId: string): void {
  for (const [k, e] of entries) if (e.userId === userId) entries.delete(k);
}

/** Forget one session by its token (signed out or revoked). */
export function forgetSessionToken(token: string): void {
  for (const [k, e] of entries) if (e.token === token) entries.delete(k);
}
