// The demo athlete opens today, marks the session done with RPE 6, and the demo coach sees it done on the calendar and in
// the roster's compliance.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { BASE, launch, newPage, shot, signIn } from "../support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function complianceOf(page: Page, name: string): Promise<number> {
  const row = page.getByTestId("roster-row").filter({ hasText: name });
  await row.waitFor();
  const text = (await row.getByTestId("compliance").innerText()).trim();
  return /(\d+) %/.test(text) ? Number(/(\d+) %/.exec(text)![1]) : 0;
}

describe("today and logging", () => {
  it("athlete logs today's session; coach sees it on the calendar and in the roster", async () => {
    const coach = await newPage(browser);
    await signIn(coach.page, "coach@northfold.test");
    await coach.page.goto(`${BASE}/roster`);
    const before = await complianceOf(coach.page, "Ines Varga");
    await shot(coach.page, "roster-coach");
    const href = await coach.page.getByRole("link", { name: "Ines Varga" }).getAttribute("href");
    const athleteId = href!.split("/").pop()!;

    const athlete = await newPage(browser);
    await athlete.page.setViewportSize({ width: 390, height: 844 });
    await signIn(athlete.page, "runner@northfold.test");
    await athlete.page.goto(`${BASE}/today`);
    const card = athlete.page.getByTestId("session-card").first();
    await card.waitFor();
    // Step targets are in the athlete's own numbers.
    await expect(card.innerText()).resolves.toMatch(/bpm/);
    await shot(athlete.page, "today-phone");
    // Before anything is logged: no answer is pre-selected and no share of the planned time is claimed.
    await card.getByText("Not logged yet.").waitFor();
    await expect(card.getByLabel("Done", { exact: true }).isChecked()).resolves.toBe(false);
    await card.getByRole("button", { name: "Save the log" }).click();
    await card.getByText("Choose how it went: done, partly done or skipped.").waitFor();
    await card.getByLabel("Done", { exact: true }).check();
    await card.getByLabel("Effort, whole session (RPE 0–10)").selectOption("6");
    await card.getByRole("button", { name: "Save the log" }).click();
    await card.getByTestId("log-summary").filter({ hasText: "RPE 6" }).waitFor();
    await expect(card.getByTestId("log-summary").innerText()).resolves.toMatch(/Done/);
    await shot(athlete.page, "today-logged");

    await coach.page.goto(`${BASE}/athletes/${athleteId}/plan`);
    await coach.page.locator('[data-testid="calendar-event"][data-log="done"]').first().waitFor();
    const doneEvents = await coach.page.locator('[data-testid="calendar-event"][data-log="done"]').count();
    expect(doneEvents).toBeGreaterThan(0);
    await shot(coach.page, "calendar-with-logs");
    await coach.page.goto(`${BASE}/roster`);
    const after = await complianceOf(coach.page, "Ines Varga");
    expect(after).toBeGreaterThan(before);
    expect(coach.problems).toEqual([]);
    expect(athlete.problems).toEqual([]);
  });
});

describe("dates as the person writes them", () => {
  it("an athlete chooses day before month: today, the zones and the calendar read so, with no ISO date left on them", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "runner@northfold.test");
    const iso = /\d{4}-\d{2}-\d{2}/;
    const dayMonth = "(Mon|Tue|Wed|Thu|Fri|Sat|Sun) \\d{1,2} (Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec)";
    const main = () => page.locator("main").innerText();
    try {
      await page.goto(`${BASE}/settings`);
      await page.getByLabel(/^Day before month/).check();
      await page.getByRole("button", { name: "Save units and dates" }).click();
      await page.getByText(/^Saved\. .* dates read like /).waitFor();

      await page.goto(`${BASE}/today`);
      await expect(page.getByText(/^Today · /).innerText()).resolves.toMatch(new RegExp(`${dayMonth} \\d{4}$`, "i"));
      expect(await main()).not.toMatch(iso);

      await page.goto(`${BASE}/zones`);
      await page
        .getByText(/effective from \d{1,2} [A-Z][a-z]{2} \d{4}/)
        .first()
        .waitFor();
      expect(await main()).not.toMatch(iso);

      await page.getByRole("link", { name: "Today" }).click();
      await page.getByRole("link", { name: "My plan and calendar" }).click();
      const title = page.locator(".fc-toolbar-title");
      await title.waitFor();
      // The week's range says its year once, as en-GB writes a range within one year.
      await expect(title.innerText()).resolves.toMatch(
        /^\d{1,2} [A-Z][a-z]{2}( \d{4})? – \d{1,2} [A-Z][a-z]{2} \d{4}$/,
      );
      const headers = await page.locator(".fc-col-header-cell").allInnerTexts();
      expect(headers).toHaveLength(7);
      for (const h of headers) expect(h.trim()).toMatch(new RegExp(`^${dayMonth}$`));
      await page
        .getByTestId(/^band-/)
        .first()
        .waitFor();
      expect(await main()).not.toMatch(iso);
      await shot(page, "plan-day-month-dates");
    } finally {
      // Back to the default for the other tests, through the same form.
      await page.goto(`${BASE}/settings`);
      await page.getByLabel(/^Year, month, day/).check();
      await page.getByRole("button", { name: "Save units and dates" }).click();
      await page.getByText(/^Saved\. /).waitFor();
    }
    expect(problems).toEqual([]);
  });
});
