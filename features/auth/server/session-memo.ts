import "server-only";

/**
 * A short in-process memory of sessions better-auth has already verified, keyed by the request's session-token cookie.
 * Verifying a session costs two HMAC checks and a database lookup; a planner page fires several API calls a second, so
 * each process remembers a verified session for at most SESSION_MEMO_MS (and never past the session's own expiry). Only
 * sessions that were found are remembered, so made-up cookies cost a lookup each and take no memory.
 *
 * Revocation: signing out, a password reset, a changed or deleted account forget the affected entries at once in the
 * process that handled them (see the database hooks in auth.ts), including a lookup that was under way at that moment;
 * another process honours a revoked session for at most SESSION_MEMO_MS more. What a user may see and change (squad
 * memberships) is never remembered: it is read on every request.
 *
 * The memory lives on globalThis: the server bundles route handlers and pages separately, each with its own copy of this
 * module, and a sign-out handled by one must be forgotten by both.
 */

export const SESSION_MEMO_MS = 30_000;
const MAX_ENTRIES = 5_000;
const MAX_TOKEN_COOKIE = 512;

interface Entry {
  userId: string;
  token: string;
  value: unknown;
  until: number;
}

interface Memory {
  entries: Map<string, Entry>;
  /** When a user's or a token's sessions were last forgotten ("u:<id>", "t:<token>"), so a lookup begun earlier is not kept. */
  forgotten: Map<string, number>;
}

const global = globalThis as unknown as { tidemarkSessionMemo?: Memory };
const memory = (global.tidemarkSessionMemo ??= { entries: new Map(), forgotten: new Map() });

/**
 * The key for a request: its better-auth session-token cookie, or null when there is none, more than one (better-auth
 * would pick one; leave that to it) or an implausibly long one. Other cookies do not count.
 */
export function sessionCookieKey(headers: Headers): string | null {
  const cookie = headers.get("cookie");
  if (!cookie) return null;
  let key: string | null = null;
  for (const piece of cookie.split(";")) {
    const p = piece.trim();
    const eq = p.indexOf("=");
    if (eq < 0 || !/^(?:__Secure-)?better-auth\.session_token$/.test(p.slice(0, eq))) continue;
    if (key !== null) return null;
    key = p;
  }
  if (key === null || key.endsWith("=") || key.length > MAX_TOKEN_COOKIE) return null;
  return key;
}

export function recallSession<T>(key: string, now = Date.now()): T | undefined {
  const e = memory.entries.get(key);
  if (!e) return undefined;
  if (e.until <= now) {
    memory.entries.delete(key);
    return undefined;
  }
  return e.value as T;
}

/**
 * Remembers a session verified by a lookup that began at `lookupStartedAt`, unless its user or token was forgotten since
 * (a sign-out that raced the lookup).
 */
export function rememberSession<T>(
  key: string,
  value: T,
  who: { userId: string; token: string; expiresAt: Date | string | number },
  lookupStartedAt: number,
  now = Date.now(),
): void {
  const since = Math.max(
    memory.forgotten.get(`u:${who.userId}`) ?? -Infinity,
    memory.forgotten.get(`t:${who.token}`) ?? -Infinity,
  );
  if (since >= lookupStartedAt) return;
  const until = Math.min(now + SESSION_MEMO_MS, new Date(who.expiresAt).getTime());
  if (!(until > now)) return;
  if (memory.entries.size >= MAX_ENTRIES) {
    // Drop the oldest tenth (a Map iterates in insertion order).
    let n = Math.ceil(MAX_ENTRIES / 10);
    for (const k of memory.entries.keys()) {
      memory.entries.delete(k);
      if (--n === 0) break;
    }
  }
  memory.entries.delete(key);
  memory.entries.set(key, { userId: who.userId, token: who.token, value, until });
}

function markForgotten(mark: string, now: number) {
  if (memory.forgotten.size >= MAX_ENTRIES) {
    // A lookup lasting longer than the memo itself is not waited for.
    for (const [k, at] of memory.forgotten) if (at < now - SESSION_MEMO_MS) memory.forgotten.delete(k);
  }
  memory.forgotten.delete(mark);
  memory.forgotten.set(mark, now);
}

/** Forget every remembered session of a user (account changed, password reset, account deleted). */
export function forgetUserSessions(userId: string, now = Date.now()): void {
  markForgotten(`u:${userId}`, now);
  for (const [k, e] of memory.entries) if (e.userId === userId) memory.entries.delete(k);
}

/** Forget one session by its token (signed out or revoked). */
export function forgetSessionToken(token: string, now = Date.now()): void {
  markForgotten(`t:${token}`, now);
  for (const [k, e] of memory.entries) if (e.token === token) memory.entries.delete(k);
}
