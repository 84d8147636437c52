// The in-process memory of verified sessions: what it keys on, how long it trusts, what forgets. Limits are our own
// choice (30 s, never past the session's expiry); "common practice" for short-lived server-side session caches.
import { describe, expect, it } from "vitest";
import { forgetSessionToken, forgetUserSessions, recallSession, rememberSession, SESSION_MEMO_MS, sessionCookieKey } from "@/features/auth/server/session-memo";

const h = (cookie?: string) => new Headers(cookie ? { cookie } : {});

describe("session memory", () => {
  it("keys on the auth cookies only, in any order, and needs a session token", () => {
    const a = sessionCookieKey(h("theme=dark; better-auth.session_token=abc.sig; better-auth.dont_remember=x"));
    const b = sessionCookieKey(h("better-auth.dont_remember=x; better-auth.session_token=abc.sig; other=1"));
    expect(a).toBe(b);
    expect(a).not.toContain("theme");
    expect(sessionCookieKey(h("__Secure-better-auth.session_token=abc.sig"))).toBe("__Secure-better-auth.session_token=abc.sig");
    expect(sessionCookieKey(h("better-auth.session_token=abc.sig2"))).not.toBe(sessionCookieKey(h("better-auth.session_token=abc.sig")));
    expect(sessionCookieKey(h("better-auth.session_token="))).toBeNull();
    expect(sessionCookieKey(h("theme=dark"))).toBeNull();
    expect(sessionCookieKey(h())).toBeNull();
  });

  it("trusts a verified session for at most SESSION_MEMO_MS and never past its expiry", () => {
    const now = 1_000_000;
    rememberSession("k1", { who: 1 }, { userId: "u1", token: "t1", expiresAt: new Date(now + 3_600_000) }, now);
    expect(recallSession("k1", now + SESSION_MEMO_MS - 1)).toEqual({ who: 1 });
    expect(recallSession("k1", now + SESSION_MEMO_MS)).toBeUndefined();
    rememberSession("k2", { who: 2 }, { userId: "u2", token: "t2", expiresAt: new Date(now + 5_000) }, now);
    expect(recallSession("k2", now + 4_999)).toEqual({ who: 2 });
    expect(recallSession("k2", now + 5_000)).toBeUndefined();
    rememberSession("k3", { who: 3 }, { userId: "u3", token: "t3", expiresAt: new Date(now - 1) }, now);
    expect(recallSession("k3", now)).toBeUndefined();
  });

  it("forgets by user and by session token", () => {
    const now = Date.now();
    const far = new Date(now + 3_600_000);
    rememberSession("a1", 1, { userId: "ua", token: "ta1", expiresAt: far }, now);
    rememberSession("a2", 2, { userId: "ua", token: "ta2", expiresAt: far }, now);
    rememberSession("b1", 3, { userId: "ub", token: "tb1", expiresAt: far }, now);
    forgetUserSessions("ua");
    expect(recallSession("a1", now)).toBeUndefined();
    expect(recallSession("a2", now)).toBeUndefined();
    expect(recallSession("b1", now)).toBe(3);
    forgetSessionToken("tb1");
    expect(recallSession("b1", now)).toBeUndefined();
  });
});
