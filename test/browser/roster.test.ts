// The demo in a real browser: Debian's chromium driven by playwright-core against the production build.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { chromium, type Browser, type Page } from "playwright-core";
import fs from "node:fs";
import path from "node:path";

const BASE = process.env.TIDEMARK_BASE_URL!;
const SHOTS = path.resolve("test/.artifacts/screenshots");
let browser: Browser;

beforeAll(async () => {
  if (!BASE) throw new Error("TIDEMARK_BASE_URL is not set: run the browser tests through `npm test`.");
  fs.mkdirSync(SHOTS, { recursive: true });
  browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
});

afterAll(async () => {
  await browser?.close();
});

async function newPage(): Promise<{ page: Page; problems: string[] }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 860 } });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") problems.push(`console: ${m.text()}`);
  });
  page.on("response", (r) => {
    if (r.status() >= 400) problems.push(`HTTP ${r.status()}: ${r.request().method()} ${r.url()}`);
  });
  page.on("pageerror", (e) => problems.push(`page error: ${e.message}`));
  page.on("requestfailed", (r) => {
    // Next.js cancels its own route prefetches when the page navigates on; that is not a failed request.
    if (r.failure()?.errorText === "net::ERR_ABORTED" && new URL(r.url()).searchParams.has("_rsc")) return;
    problems.push(`request failed: ${r.url()} ${r.failure()?.errorText}`);
  });
  return { page, problems };
}

async function signIn(page: Page, email: string) {
  await page.goto(`${BASE}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("northfold-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
}

describe("demo sign-ins", () => {
  it("the head coach sees the roster of six athletes", async () => {
    const { page, problems } = await newPage();
    await signIn(page, "coach@northfold.test");
    await page.waitForURL(`${BASE}/roster`);
    await page.getByTestId("roster-row").first().waitFor();
    await expect(page.getByTestId("roster-row").count()).resolves.toBe(6);
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe("Northfold Endurance");
    await expect(page.getByText("Ines Varga").isVisible()).resolves.toBe(true);
    await page.screenshot({ path: path.join(SHOTS, "roster.png"), fullPage: true });
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("an athlete lands on today and is refused the roster", async () => {
    const { page, problems } = await newPage();
    await signIn(page, "runner@northfold.test");
    await page.waitForURL(`${BASE}/today`);
    await page.getByRole("heading", { name: "Hello, Ines" }).waitFor();
    await page.screenshot({ path: path.join(SHOTS, "today.png"), fullPage: true });
    await page.goto(`${BASE}/roster`);
    await page.getByRole("heading", { name: "The roster is for coaches" }).waitFor();
    await expect(page.getByTestId("roster-row").count()).resolves.toBe(0);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("a wrong password shows a clear message and stays on sign-in", async () => {
    const { page } = await newPage();
    await page.goto(`${BASE}/sign-in`);
    await page.getByLabel("E-mail").fill("coach@northfold.test");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText("That e-mail and password do not match an account.").waitFor();
    expect(page.url()).toBe(`${BASE}/sign-in`);
    await page.context().close();
  });
});
