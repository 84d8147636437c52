// Signing out ends the session on the running production server at once, for API routes and pages alike: the server
// remembers verified sessions for up to 30 s (features/auth/server/session-memo.ts), and route handlers and pages are
// bundled separately, so both must forget a signed-out session. A replayed cookie is how a stolen one would be used.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { BASE, launch, newPage, signIn } from "../support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("sessions", () => {
  it("a signed-out session's cookie, replayed, opens neither an API route nor a page", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "walker@northfold.test");
    const cookie = (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
    const api = () => fetch(`${BASE}/api/me`, { headers: { cookie } });
    // The page streams in behind a loading state, so a signed-out visit still answers 200: it then says so in its header
    // (sign-in links, no "Sign out") and redirects to sign-in from within the page.
    const today = async () => (await fetch(`${BASE}/today`, { headers: { cookie }, redirect: "manual" })).text();
    // Both kinds of handler have seen (and so remember) the session.
    expect((await api()).status).toBe(200);
    expect(await today()).toContain(">Sign out<");
    expect((await api()).status).toBe(200);
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL((u) => u.pathname.startsWith("/sign-in"));
    expect((await api()).status).toBe(401);
    const replayedPage = await today();
    expect(replayedPage).not.toContain(">Sign out<");
    expect(replayedPage).toMatch(/NEXT_REDIRECT;replace;\/sign-in/);
    expect(problems).toEqual([]);
  });

  it("before the page's script runs, forms cannot be sent (a plain browser submission would put the password in the address)", async () => {
    const { page } = await newPage(browser);
    // The script never arrives, as on a very slow connection.
    await page.route("**/_next/static/chunks/**", (route) => route.abort());
    await page.goto(`${BASE}/sign-in`, { waitUntil: "domcontentloaded" });
    await page.getByLabel("E-mail").fill("walker@northfold.test");
    await page.getByLabel("Password").fill("northfold-demo");
    // The only submit button is disabled, which also stops Enter from sending the form (HTML's implicit submission).
    await expect(page.getByRole("button", { name: "Sign in" }).isDisabled()).resolves.toBe(true);
    await expect(page.locator('form [type="submit"]:not([disabled])').count()).resolves.toBe(0);
  });
});
