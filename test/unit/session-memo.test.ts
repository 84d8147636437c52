// The in-process memory of verified sessions: what it keys on, how long it trusts, what forgets. Limits are our own
// choice (30 s, never past the session's expiry); "common practice" for short-lived server-side session caches.
import { describe, expect, it } from "vitest";
import {
  forgetSessionToken,
  forgetUserSessions,
  recallSession,
  rememberSession,
  SESSION_MEMO_MS,
  sessionCookieKey,
} from "@/features/auth/server/session-memo";

const h = (cookie?: string) => new Headers(cookie ? { cookie } : {});
const far = (now: number) => new Date(now + 3_600_000);

describe("session memory", () => {
  it("keys on the session-token cookie alone", () => {
    const a = sessionCookieKey(h("theme=dark; better-auth.session_token=abc.sig; better-auth.dont_remember=x"));
    expect(a).toBe("better-auth.session_token=abc.sig");
    // Other cookies, even ones named like better-auth's, neither change the key nor grow it.
    expect(sessionCookieKey(h(`better-auth.pad=${"x".repeat(4000)}; better-auth.session_token=abc.sig`))).toBe(a);
    expect(sessionCookieKey(h("__Secure-better-auth.session_token=abc.sig"))).toBe(
      "__Secure-better-auth.session_token=abc.sig",
    );
    expect(sessionCookieKey(h("better-auth.session_token=abc.sig2"))).not.toBe(a);
  });

  it("leaves to better-auth what is unusual: no token, an empty or very long one, or two of them", () => {
    expect(sessionCookieKey(h())).toBeNull();
    expect(sessionCookieKey(h("theme=dark"))).toBeNull();
    expect(sessionCookieKey(h("better-auth.session_token="))).toBeNull();
    expect(sessionCookieKey(h(`better-auth.session_token=${"a".repeat(600)}`))).toBeNull();
    expect(sessionCookieKey(h("better-auth.session_token=a.s; better-auth.session_token=b.s"))).toBeNull();
    expect(sessionCookieKey(h("better-auth.session_token=a.s; __Secure-better-auth.session_token=b.s"))).toBeNull();
  });

  it("trusts a verified session for at most SESSION_MEMO_MS and never past its expiry", () => {
    const now = 1_000_000;
    rememberSession("k1", { who: 1 }, { userId: "u1", token: "t1", expiresAt: far(now) }, now, now);
    expect(recallSession("k1", now + SESSION_MEMO_MS - 1)).toEqual({ who: 1 });
    expect(recallSession("k1", now + SESSION_MEMO_MS)).toBeUndefined();
    rememberSession("k2", { who: 2 }, { userId: "u2", token: "t2", expiresAt: new Date(now + 5_000) }, now, now);
    expect(recallSession("k2", now + 4_999)).toEqual({ who: 2 });
    expect(recallSession("k2", now + 5_000)).toBeUndefined();
    rememberSession("k3", { who: 3 }, { userId: "u3", token: "t3", expiresAt: new Date(now - 1) }, now, now);
    expect(recallSession("k3", now)).toBeUndefined();
  });

  it("forgets by user and by session token", () => {
    const now = Date.now();
    rememberSession("a1", 1, { userId: "ua", token: "ta1", expiresAt: far(now) }, now, now);
    rememberSession("a2", 2, { userId: "ua", token: "ta2", expiresAt: far(now) }, now, now);
    rememberSession("b1", 3, { userId: "ub", token: "tb1", expiresAt: far(now) }, now, now);
    forgetUserSessions("ua", now + 1);
    expect(recallSession("a1", now + 1)).toBeUndefined();
    expect(recallSession("a2", now + 1)).toBeUndefined();
    expect(recallSession("b1", now + 1)).toBe(3);
    forgetSessionToken("tb1", now + 1);
    expect(recallSession("b1", now + 1)).toBeUndefined();
  });

  it("does not keep a lookup that began before its session was signed out or its user changed", () => {
    const t0 = Date.now() + 10_000;
    forgetSessionToken("tc", t0 + 5); // signed out while the lookup (begun at t0) was under way
    rememberSession("c", "stale", { userId: "uc", token: "tc", expiresAt: far(t0) }, t0, t0 + 10);
    expect(recallSession("c", t0 + 10)).toBeUndefined();
    forgetUserSessions("ud", t0 + 5);
    rememberSession("d", "stale", { userId: "ud", token: "td", expiresAt: far(t0) }, t0, t0 + 10);
    expect(recallSession("d", t0 + 10)).toBeUndefined();
    // A lookup begun after the sign-out is a new sign-in's, and is kept.
    rememberSession("e", "fresh", { userId: "ud", token: "te", expiresAt: far(t0) }, t0 + 6, t0 + 10);
    expect(recallSession("e", t0 + 10)).toBe("fresh");
  });
});
