// The outbox page as anonymous, athlete, coach and site operator, and the redirect after sign-in, in a real browser.
import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { BASE, launch, newPage, shot, signIn } from "../support/browser";
import { query } from "../support/db";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

/** Opens the outbox page; whether it showed the "Nothing here" page (the app streams pages, so that page may come with 200). */
async function outboxRefused(page: Page, query = ""): Promise<boolean> {
  await page.goto(`${BASE}/outbox${query}`);
  await page
    .getByRole("heading", { name: /Nothing here|Outbox/ })
    .first()
    .waitFor();
  return (await page.getByRole("heading", { name: "Nothing here" }).count()) === 1;
}

describe("the local outbox page", () => {
  it("is not found for anyone but the site operator, who sees account links hidden", async () => {
    // A password reset for a demo athlete: its link would open the account.
    const reset = await fetch(`${BASE}/api/auth/request-password-reset`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: BASE },
      body: JSON.stringify({ email: "walker@northfold.test", redirectTo: "/reset-password" }),
    });
    expect(reset.status).toBe(200);
    const [row] = await query<{ id: string; meta: { url: string } }>(
      `select id, meta from outbox where kind = 'password_reset' and to_address = 'walker@northfold.test' order by created_at desc limit 1`,
    );
    const secret = row!.meta.url.split("/reset-password/")[1]!.split("?")[0]!;
    expect(secret.length).toBeGreaterThan(10);

    const anonymous = await newPage(browser);
    expect(await outboxRefused(anonymous.page)).toBe(true);
    expect(anonymous.page.url()).not.toMatch(/sign-in/);
    expect(await outboxRefused(anonymous.page, `?id=${row!.id}`)).toBe(true);
    expect(await anonymous.page.content()).not.toContain(secret);

    for (const email of ["runner@northfold.test", "coach@northfold.test"]) {
      const p = await newPage(browser);
      await signIn(p.page, email);
      expect(await outboxRefused(p.page, `?id=${row!.id}`), email).toBe(true);
      expect(await p.page.content()).not.toContain(secret);
    }

    const operator = await newPage(browser);
    await signIn(operator.page, "operator@northfold.test");
    expect(await outboxRefused(operator.page)).toBe(false);
    await operator.page.getByRole("link", { name: "Reset your Tidemark password" }).first().click();
    await operator.page.getByTestId("outbox-text").waitFor();
    await operator.page.waitForURL(/\/outbox\?id=/);
    const text = await operator.page.getByTestId("outbox-text").innerText();
    expect(text).toMatch(/link hidden/);
    expect(await operator.page.content()).not.toContain(secret);
    await expect(operator.page.getByRole("link", { name: "Open the link in this message" }).count()).resolves.toBe(0);
    await shot(operator.page, "outbox-operator");
  });
});

describe("the redirect after sign-in", () => {
  for (const next of ["/%5Cevil.test%2Fx", "/%09/evil.test/x", "//evil.test/x"]) {
    it(`stays on the site for next=${next}`, async () => {
      const { page } = await newPage(browser);
      await page.goto(`${BASE}/sign-in?next=${next}`);
      await page.getByLabel("E-mail").fill("coach@northfold.test");
      await page.getByLabel("Password").fill("northfold-demo");
      await page.getByRole("button", { name: "Sign in" }).click();
      await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"));
      expect(new URL(page.url()).origin).toBe(new URL(BASE).origin);
    });
  }

  it("follows a next on the site", async () => {
    const { page } = await newPage(browser);
    await page.goto(`${BASE}/sign-in?next=${encodeURIComponent("/templates")}`);
    await page.getByLabel("E-mail").fill("coach@northfold.test");
    await page.getByLabel("Password").fill("northfold-demo");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL(/\/templates/);
  });
});

describe("the content security policy", () => {
  it("allows scripts by a fresh nonce per request, never 'unsafe-inline', and every script of the page carries it", async () => {
    const { page, problems } = await newPage(browser);
    const first = await page.goto(`${BASE}/sign-in`);
    const policy = first!.headers()["content-security-policy"]!;
    const script = policy
      .split(";")
      .map((d) => d.trim())
      .find((d) => d.startsWith("script-src"))!;
    expect(script).toMatch(/'nonce-[A-Za-z0-9+/=]{16,}'/);
    expect(script).not.toContain("'unsafe-inline'");
    const nonce = /'nonce-([^']+)'/.exec(script)![1]!;
    const nonces = await page.locator("script").evaluateAll((els) => els.map((e) => (e as HTMLScriptElement).nonce));
    expect(nonces.length).toBeGreaterThan(0);
    expect(nonces.every((n) => n === nonce)).toBe(true);
    const second = await page.goto(`${BASE}/sign-in`);
    expect(/'nonce-([^']+)'/.exec(second!.headers()["content-security-policy"]!)![1]).not.toBe(nonce);
    // The page works under it: signing in runs the app's scripts, and nothing was blocked.
    await signIn(page, "coach@northfold.test");
    expect(problems.filter((p) => /Content Security Policy|Refused to/.test(p))).toEqual([]);
  });
});

describe("public files", () => {
  it("robots.txt keeps search engines to the front page; the web-app manifest and its icon are served", async () => {
    const robots = await fetch(`${BASE}/robots.txt`);
    expect(robots.status).toBe(200);
    expect(await robots.text()).toMatch(/Disallow: \//);
    const manifest = await fetch(`${BASE}/manifest.webmanifest`);
    expect(manifest.status).toBe(200);
    const m = (await manifest.json()) as { name: string; start_url: string; icons: { src: string }[] };
    expect(m).toMatchObject({ name: "Tidemark", start_url: "/home" });
    expect((await fetch(`${BASE}${m.icons[0]!.src}`)).status).toBe(200);
    const { page } = await newPage(browser);
    await page.goto(`${BASE}/sign-in`);
    await expect(page.locator('link[rel="manifest"]').getAttribute("href")).resolves.toBe("/manifest.webmanifest");
  });
});

describe("CSV downloads from the athlete page", () => {
  it("an athlete downloads their own logs from their page", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "runner@northfold.test");
    await page.getByRole("link", { name: "My zones, tests and load" }).click();
    await page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const [download] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("link", { name: "Logs, last year as CSV" }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/^tidemark-logs-\d{4}-\d{2}-\d{2}-to-\d{4}-\d{2}-\d{2}\.csv$/);
    const text = fs.readFileSync((await download.path())!, "utf8").replace(/^\uFEFF/, "");
    expect(text.split("\r\n")[0]).toMatch(/^date,title,sport,status,duration_min/);
    expect(text.split("\r\n").length).toBeGreaterThan(2);
    // The same logs as a workbook.
    const [workbook] = await Promise.all([
      page.waitForEvent("download"),
      page.getByRole("link", { name: "Logs, last year as Excel workbook" }).click(),
    ]);
    expect(workbook.suggestedFilename()).toMatch(/^tidemark-logs-.*\.xlsx$/);
    expect(problems).toEqual([]);
  });
});

describe("readiness hold and clearance in the browser", () => {
  it("a symptom holds hard sessions on the plan; the coach records a clearance with the form and the hold lifts", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.getByRole("link", { name: "Lotte Aune" }).click();
    await page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const athleteId = page.url().split("/athletes/")[1]!;
    // The athlete reports chest pain (recorded here by the coach for them).
    await page.goto(`${BASE}/athletes/${athleteId}/screening`);
    const questions = page.locator("fieldset");
    await questions.first().waitFor();
    for (let i = 0; i < (await questions.count()); i++)
      await questions
        .nth(i)
        .getByRole("radio", { name: i === 0 ? "Yes" : "No" })
        .check();
    await page.getByRole("button", { name: "Save the answers" }).click();
    await page.getByRole("heading", { name: "Record a clearance" }).waitFor();
    await page.goto(`${BASE}/athletes/${athleteId}/plan`);
    await page.getByTestId("readiness-banner").getByText("Hold hard sessions and testing").waitFor();
    // The clearance, typed in as the physician gave it.
    await page.goto(`${BASE}/athletes/${athleteId}/screening`);
    await page.getByLabel("Cleared by (name)").fill("Dr Lena Berg");
    await page.getByLabel("Their role (as they gave it)").fill("sports physician");
    await page.getByRole("button", { name: "Record the clearance" }).click();
    await page
      .getByText(/Dr Lena Berg \(sports physician\)/)
      .first()
      .waitFor();
    await page.goto(`${BASE}/athletes/${athleteId}/plan`);
    await page.getByRole("heading", { name: "Plan" }).waitFor();
    await expect(page.getByText("Hold hard sessions and testing").count()).resolves.toBe(0);
    expect(problems).toEqual([]);
  });
});
