/** Shared browser-test helpers: Debian's chromium through playwright-core, and a page that records every problem. */
import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { launchChromium } from "../../scripts/chromium";

export const BASE = process.env.TIDEMARK_BASE_URL ?? "";
export const SHOTS = path.resolve("test/.artifacts/screenshots");

export async function launch(): Promise<Browser> {
  if (!BASE) throw new Error("TIDEMARK_BASE_URL is not set: run the browser tests through `npm test`.");
  fs.mkdirSync(SHOTS, { recursive: true });
  return launchChromium();
}

export async function newPage(browser: Browser): Promise<{ page: Page; problems: string[] }> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  // A step that cannot happen fails within this time, with the locator it waited for, instead of hanging the suite.
  page.setDefaultTimeout(20_000);
  // Every page load waits until the app has hydrated (app/providers.tsx marks <html>), as a person would wait for a page
  // to respond: a choice made in a form before then can be lost. A test that asks for an earlier point ("commit",
  // "domcontentloaded") gets the page as it is then.
  const goto = page.goto.bind(page);
  page.goto = async (url, options) => {
    const response = await goto(url, options);
    const early = options?.waitUntil === "commit" || options?.waitUntil === "domcontentloaded";
    if (!early && response?.headers()["content-type"]?.includes("text/html"))
      await page.locator("html[data-hydrated]").waitFor({ state: "attached" });
    return response;
  };
  const problems: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") problems.push(`console: ${m.text()}`);
  });
  page.on("response", (r) => {
    if (r.status() >= 400) problems.push(`HTTP ${r.status()}: ${r.request().method()} ${r.url()}`);
  });
  page.on("pageerror", (e) => problems.push(`page error: ${e.message}`));
  // A request the browser itself cancels because the page is moving on (a new document is loading, or Next.js drops a
  // route prefetch) is not a failure; every other failed request is. "Moving on" lasts from the main frame's navigation
  // request until the new document has loaded.
  let navigating = false;
  page.on("request", (r) => {
    if (r.isNavigationRequest() && r.frame() === page.mainFrame()) navigating = true;
  });
  page.on("load", () => {
    navigating = false;
  });
  page.on("requestfailed", (r) => {
    if (r.failure()?.errorText === "net::ERR_ABORTED") {
      if (new URL(r.url()).searchParams.has("_rsc")) return;
      if (navigating && !(r.isNavigationRequest() && r.frame() === page.mainFrame())) return;
    }
    problems.push(
      `request failed: ${r.method()} ${r.resourceType()} nav=${r.isNavigationRequest()} ${r.url()} ${r.failure()?.errorText}`,
    );
  });
  return { page, problems };
}

export async function signIn(page: Page, email: string, password = "northfold-demo") {
  await page.goto(`${BASE}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  // Signing in lands on /home, which forwards to the role's home page.
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in") && u.pathname !== "/home");
}

const require = createRequire(import.meta.url);
const AXE_SOURCE = fs.readFileSync(require.resolve("axe-core/axe.min.js"), "utf8");

/**
 * WCAG 2.2 A and AA checks of the page as it is now, with axe-core (injected through the browser's own evaluation, which
 * the page's content security policy does not govern): every serious or critical violation, one line each, with the
 * rule, its help text and the first offending elements.
 */
export async function accessibilityProblems(page: Page): Promise<string[]> {
  // A page refreshed in place (router.refresh) streams its head again: check once it has settled and has its title.
  await page.waitForLoadState("networkidle");
  await page.waitForFunction(() => document.title.trim().length > 0, undefined, { timeout: 5000 }).catch(() => {});
  await page.evaluate(AXE_SOURCE);
  const violations = (await page.evaluate(async () => {
    const axe = (
      window as unknown as { axe: { run: (ctx: Document, opts: unknown) => Promise<{ violations: unknown[] }> } }
    ).axe;
    const r = await axe.run(document, {
      runOnly: { type: "tag", values: ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"] },
      resultTypes: ["violations"],
    });
    return r.violations;
  })) as { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[];
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map(
      (v) =>
        `a11y ${v.impact} ${v.id} on ${new URL(page.url()).pathname}: ${v.help} — ${v.nodes
          .slice(0, 3)
          .map((n) => n.target.join(" "))
          .join(", ")}${v.nodes.length > 3 ? ` (+${v.nodes.length - 3} more)` : ""}`,
    );
}

export async function shot(page: Page, name: string) {
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

/**
 * Drags a template from the tray (the dock along the bottom of the window) onto a day of the calendar with the mouse, as
 * a coach does. The budget band above the calendar previews the drop and may grow meanwhile, so the pointer aims at the
 * day again before letting go.
 */
export async function dragTemplate(page: Page, name: string, date: string) {
  const cell = page.locator(`td.fc-day[data-date="${date}"]`);
  // The middle of the window: the dock covers its bottom edge.
  await cell.evaluate((el) => el.scrollIntoView({ block: "center" }));
  const item = page.locator("[data-template-id]", { hasText: name }).first();
  await item.scrollIntoViewIfNeeded();
  const from = (await item.boundingBox())!;
  await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
  await page.mouse.down();
  await page.mouse.move(from.x + from.width / 2 - 20, from.y + from.height / 2, { steps: 5 });
  for (let i = 0; i < 3; i++) {
    const to = (await cell.boundingBox())!;
    await page.mouse.move(to.x + to.width / 2, to.y + to.height / 2, { steps: 10 });
    await page.waitForTimeout(150);
  }
  await page.mouse.up();
}

/** Drags a calendar event with the mouse from its day to another day's cell, as a coach does. */
export async function dragEvent(page: Page, title: string, fromDate: string, toDate: string) {
  const event = page.locator(`td.fc-day[data-date="${fromDate}"] .fc-event`, { hasText: title }).first();
  await event.waitFor();
  const from = (await event.boundingBox())!;
  const cell = page.locator(`td.fc-day[data-date="${toDate}"]`);
  await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
  await page.mouse.down();
  await page.mouse.move(from.x + from.width / 2 + 10, from.y + from.height / 2, { steps: 5 });
  for (let i = 0; i < 3; i++) {
    const to = (await cell.boundingBox())!;
    await page.mouse.move(to.x + to.width / 2, to.y + to.height / 2 + 10, { steps: 10 });
    await page.waitForTimeout(150);
  }
  await page.mouse.up();
}
