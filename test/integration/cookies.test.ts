// Session cookies are not readable by scripts (HttpOnly) and not sent on cross-site requests (SameSite=Lax); Secure is
// added when the site runs on https (features/auth/server/auth.ts: useSecureCookies), which these tests on http cannot show.
import { describe, expect, it } from "vitest";
import { Browser } from "../support/api";

describe("session cookies", () => {
  it("are HttpOnly and SameSite=Lax", async () => {
    const b = new Browser("198.51.100.61");
    const email = `cookie-${Date.now()}@example.test`;
    await b.signUp("Cookie check", email, "correct-horse-battery", { verify: false });
    // The session starts when the address is confirmed (the link in the verification message signs in).
    const r = await b.verifyEmail(email);
    expect(r.status).toBeLessThan(400);
    const session = r.headers.getSetCookie().find((c) => /session_token=/.test(c));
    expect(session).toBeTruthy();
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
  });
});
