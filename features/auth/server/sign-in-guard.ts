import "server-only";
import { eq, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { sendSignInPausedNotice } from "@/features/messages/server";

/**
 * A per-account limit on wrong passwords, beside the per-address rate limit: one shared address (a lab, a club's Wi-Fi)
 * must not lock everyone out, and changing addresses must not allow endless guessing at one account. After
 * SIGN_IN_FAILURES_BEFORE_PAUSE wrong passwords within SIGN_IN_WINDOW_MIN minutes, sign-in to that address pauses for
 * SIGN_IN_PAUSE_MIN minutes (the right password too) and the owner is told by e-mail. Addresses without an account are
 * counted the same way, so the answer never says which addresses have one. (Limits: common practice, e.g. OWASP's
 * authentication guidance of a short lockout after a few failures.)
 */
export const SIGN_IN_FAILURES_BEFORE_PAUSE = 5;
export const SIGN_IN_WINDOW_MIN = 15;
export const SIGN_IN_PAUSE_MIN = 15;

const key = (email: string) => email.trim().toLowerCase();

/** Minutes left of a pause on this address, or 0. */
export async function signInPausedFor(email: string, now = new Date()): Promise<number> {
  const [row] = await getDb()
    .select({ lockedUntil: schema.signInGuard.lockedUntil })
    .from(schema.signInGuard)
    .where(eq(schema.signInGuard.email, key(email)));
  if (!row?.lockedUntil || row.lockedUntil <= now) return 0;
  return Math.max(1, Math.ceil((row.lockedUntil.getTime() - now.getTime()) / 60_000));
}

/** Counts a wrong password; starts a pause (and tells the owner) when it is the last one allowed. One statement. */
export async function recordFailedSignIn(email: string): Promise<{ paused: boolean }> {
  const db = getDb();
  const k = key(email);
  const windowStart = sql`now() - make_interval(mins => ${SIGN_IN_WINDOW_MIN})`;
  const rows = await db.execute<{ failures: number }>(sql`
    insert into sign_in_guard (email, failures, window_started_at) values (${k}, 1, now())
    on conflict (email) do update set
      failures = case when sign_in_guard.window_started_at < ${windowStart} or sign_in_guard.locked_until is not null then 1 else sign_in_guard.failures + 1 end,
      window_started_at = case when sign_in_guard.window_started_at < ${windowStart} or sign_in_guard.locked_until is not null then now() else sign_in_guard.window_started_at end,
      locked_until = null
    returning failures`);
  const failures = Number(rows[0]?.failures ?? 0);
  if (failures < SIGN_IN_FAILURES_BEFORE_PAUSE) return { paused: false };
  await db
    .update(schema.signInGuard)
    .set({ lockedUntil: sql`now() + make_interval(mins => ${SIGN_IN_PAUSE_MIN})`, failures: 0 })
    .where(eq(schema.signInGuard.email, k));
  const [owner] = await db
    .select({ email: schema.user.email, name: schema.user.name })
    .from(schema.user)
    .where(eq(sql`lower(${schema.user.email})`, k));
  if (owner) await sendSignInPausedNotice({ to: owner.email, name: owner.name, failures, minutes: SIGN_IN_PAUSE_MIN });
  return { paused: true };
}

/** A successful sign-in clears the count. */
export async function clearFailedSignIns(email: string): Promise<void> {
  await getDb()
    .delete(schema.signInGuard)
    .where(eq(schema.signInGuard.email, key(email)));
}
