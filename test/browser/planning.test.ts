// The coach drags interval templates onto a week until it breaks its budget, sees the reason, applies the fix, and the
// mark clears. The week is far beyond the demo season, so its budget is the default polarised one (80/5/15 ± 5 %).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import {
  accessibilityProblems,
  BASE,
  dragEvent,
  dragTemplate,
  launch,
  newPage,
  shot,
  signIn,
} from "../support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

function mondayInWeeks(weeks: number): string {
  const now = new Date();
  const dow = (now.getUTCDay() + 6) % 7;
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() - dow + weeks * 7))
    .toISOString()
    .slice(0, 10);
}
const plus = (iso: string, n: number) =>
  new Date(Date.parse(`${iso}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);

describe("planning in the browser", () => {
  it("drag intervals until the week is over budget, then apply the fix and see the mark clear", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.getByRole("link", { name: "Ines Varga" }).click();
    await page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const athleteId = page.url().split("/athletes/")[1]!;
    // A week beyond the demo season, different on each run so that runs against one database do not meet.
    const week = mondayInWeeks(110 + (Math.floor(Date.now() / 1000) % 400));
    // Two easy long runs in the week and the next, through the API with the coach's session.
    const templates = (await (await page.request.get(`${BASE}/api/templates`)).json()) as {
      id: string;
      name: string;
    }[];
    const long = templates.find((t) => t.name === "Long run 90 min")!;
    for (const d of [plus(week, 5), plus(week, 6), plus(week, 12), plus(week, 13)]) {
      const r = await page.request.post(`${BASE}/api/athletes/${athleteId}/sessions`, {
        data: { date: d, templateId: long.id },
      });
      expect(r.status()).toBe(201);
    }
    await page.goto(`${BASE}/athletes/${athleteId}/plan?week=${week}`);
    const band = page.getByTestId(`band-${week}`);
    await band.waitFor();
    await expect(band.getAttribute("data-over")).resolves.toBe("no");
    // Three sessions of 4 × 8 min above VT2 (51 min zone 1, 32 min zone 3 each): 333 min zone 1, 96 min zone 3 → 22.4 %.
    // They are cycling sessions for a runner: each drop asks first, and nothing is planned until the coach says yes.
    for (const d of [1, 2, 3]) {
      await dragTemplate(page, "4 × 8 min above VT2", plus(week, d));
      const ask = page.getByRole("alertdialog");
      await ask.getByText(/is a cycling template, and this athlete trains running/).waitFor();
      if (d === 1) {
        await ask.getByRole("button", { name: "Do not plan it" }).click();
        await ask.waitFor({ state: "detached" });
        await expect(page.locator(`td.fc-day[data-date="${plus(week, d)}"] .fc-event`).count()).resolves.toBe(0);
        await dragTemplate(page, "4 × 8 min above VT2", plus(week, d));
      }
      await page.getByRole("alertdialog").getByRole("button", { name: "Plan it anyway" }).click();
      await page
        .locator(`td.fc-day[data-date="${plus(week, d)}"] .fc-event`, { hasText: "4 × 8 min above VT2" })
        .waitFor();
    }
    await page.getByText(`Planned "4 × 8 min above VT2" on ${plus(week, 3)}.`).waitFor();
    await page.locator(`[data-testid="band-${week}"][data-over="yes"]`).waitFor();
    await expect(band.textContent()).resolves.toMatch(
      /Zone 3 is 22\.4 % of the week; the polarised budget allows 20 %/,
    );
    await shot(page, "plan-over-budget");
    await band.getByRole("button", { name: "Apply the fix" }).click();
    await page.locator(`[data-testid="band-${week}"][data-over="no"]`).waitFor();
    await expect(page.getByTestId(`band-${week}`).textContent()).resolves.toMatch(/Within budget/);
    await shot(page, "plan-fixed");
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("the tray is a dock that stays in view, finds templates by name, sport and zones, folds, and plans from the keyboard", async () => {
    const { page, problems } = await newPage(browser);
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, "coach@northfold.test");
    await page.getByRole("link", { name: "Jonas Okafor" }).click();
    await page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const athleteId = page.url().split("/athletes/")[1]!;
    await page.goto(`${BASE}/athletes/${athleteId}/plan`);
    const dock = page.getByTestId("template-dock");
    const cards = dock.locator("[data-template-id]");
    await cards.first().waitFor();
    // The cyclist's own sport first.
    await expect(cards.first().getAttribute("data-sport")).resolves.toBe("cycling");
    // In view at the bottom of the window while the page scrolls.
    await page.mouse.wheel(0, 2000);
    const box = (await dock.boundingBox())!;
    expect(box.y + box.height).toBeLessThanOrEqual(900 + 1);
    expect(box.y).toBeGreaterThan(450);
    await dock.getByLabel("Search templates").fill("spin");
    await expect(cards.allTextContents()).resolves.toEqual([expect.stringMatching(/^Recovery spin 45 min/)]);
    await dock.getByLabel("Search templates").fill("");
    await dock.getByLabel("Zones").selectOption("z3");
    for (const text of await cards.allTextContents()) expect(text).toMatch(/z3 [1-9]/);
    await dock.getByLabel("Sport").selectOption("rowing");
    await expect(cards.allTextContents()).resolves.toEqual([expect.stringMatching(/^6 × 2 min pieces/)]);
    await dock.getByLabel("Sport").selectOption("all");
    await dock.getByLabel("Zones").selectOption("any");
    await dock.getByRole("button", { name: "Fold the tray" }).click();
    await expect(cards.first().isVisible()).resolves.toBe(false);
    await dock.getByRole("button", { name: "Open the tray" }).click();
    // Enter on a card opens the keyboard form with that template chosen.
    const card = dock.locator("[data-template-id]", { hasText: "Endurance ride 2 h" });
    await card.focus();
    await page.keyboard.press("Enter");
    const form = page.getByTestId("keyboard-planner");
    await expect(form.getAttribute("open")).resolves.not.toBeNull();
    await expect(form.getByLabel("Template").inputValue()).resolves.toBe(
      (await card.getAttribute("data-template-id"))!,
    );
    const day = plus(mondayInWeeks(120 + (Math.floor(Date.now() / 1000) % 300)), 2);
    await form.getByLabel("Day").fill(day);
    await form.getByRole("button", { name: "Plan it" }).click();
    await page.getByText(`Planned "Endurance ride 2 h" on ${day}.`).waitFor();
    await page.locator(`td.fc-day[data-date="${day}"] .fc-event`, { hasText: "Endurance ride 2 h" }).waitFor();
    await shot(page, "plan-tray-dock");
    expect(await accessibilityProblems(page)).toEqual([]);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("a coach edits a template in the builder at the top of the templates page", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.goto(`${BASE}/templates`);
    // A copy to edit, so that the demo's own template stays as it is for the other tests.
    const card = page.getByTestId("template-card").filter({ hasText: "Recovery jog 30 min" }).first();
    await card.getByRole("button", { name: "Duplicate" }).click();
    const copy = page.getByTestId("template-card").filter({ hasText: "Recovery jog 30 min (copy)" }).first();
    await copy.waitFor();
    await copy.getByRole("button", { name: "Edit" }).click();
    await page.getByRole("heading", { name: 'Edit "Recovery jog 30 min (copy)"' }).waitFor();
    await expect(page.getByLabel("Name").inputValue()).resolves.toBe("Recovery jog 30 min (copy)");
    const name = `Shakeout jog ${Date.now() % 100000}`;
    await page.getByLabel("Name").fill(name);
    await page.getByRole("button", { name: "Save the changes" }).click();
    await page.getByRole("heading", { name: "Build a template" }).waitFor();
    await page.getByTestId("template-card").filter({ hasText: name }).waitFor();
    expect(await accessibilityProblems(page)).toEqual([]);
    await shot(page, "templates-edit");
    // Clean up: the copy goes again.
    await page.getByTestId("template-card").filter({ hasText: name }).getByRole("button", { name: "Delete" }).click();
    await page.getByTestId("template-card").filter({ hasText: name }).waitFor({ state: "detached" });
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("a move made on a session someone else has just changed shows the conflict and the calendar reloads", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.getByRole("link", { name: "Jonas Okafor" }).click();
    await page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const athleteId = page.url().split("/athletes/")[1]!;
    const week = mondayInWeeks(110 + (Math.floor(Date.now() / 1000) % 400));
    const made = await page.request.post(`${BASE}/api/athletes/${athleteId}/sessions`, {
      data: {
        date: plus(week, 1),
        title: "Tempo ride",
        sport: "cycling",
        structure: [{ type: "step", kind: "work", durationS: 3600, zone: 2 }],
      },
    });
    expect(made.status()).toBe(201);
    const { id } = (await made.json()) as { id: string };
    await page.goto(`${BASE}/athletes/${athleteId}/plan?week=${week}`);
    await page.locator(".fc-event", { hasText: "Tempo ride" }).first().click();
    // Meanwhile the assistant coach renames it (version 1 → 2).
    const assistant = await newPage(browser);
    await signIn(assistant.page, "assistant@northfold.test");
    const renamed = await assistant.page.request.patch(`${BASE}/api/sessions/${id}`, {
      data: { title: "Tempo ride (shorter)", version: 1 },
    });
    expect(renamed.status()).toBe(200);
    // The head coach, still looking at version 1, moves it.
    await page.getByLabel("New day for Tempo ride").fill(plus(week, 3));
    await page.getByRole("button", { name: "Move to this day" }).click();
    await page.getByText(/Someone else changed this session since you opened it/).waitFor();
    await page.locator(".fc-event", { hasText: "Tempo ride (shorter)" }).first().waitFor();
    await expect(
      page.locator(`td.fc-day[data-date="${plus(week, 1)}"] .fc-event`, { hasText: "Tempo ride (shorter)" }).count(),
    ).resolves.toBe(1);
    await shot(page, "plan-edit-conflict");
    // The refused move is the only failed request.
    expect(
      problems.filter((p) => !/HTTP 409: PATCH .*\/api\/sessions\//.test(p) && !/status of 409 \(Conflict\)/.test(p)),
    ).toEqual([]);
    await page.context().close();
    await assistant.page.context().close();
  });

  it("dragging a planned session to another day with the mouse moves it (server state checked)", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.getByRole("link", { name: "Jonas Okafor" }).click();
    await page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const athleteId = page.url().split("/athletes/")[1]!;
    const week = mondayInWeeks(111 + (Math.floor(Date.now() / 1000) % 400));
    const made = await page.request.post(`${BASE}/api/athletes/${athleteId}/sessions`, {
      data: {
        date: plus(week, 1),
        title: "Drag me",
        sport: "cycling",
        structure: [{ type: "step", kind: "work", durationS: 3600, zone: 1 }],
      },
    });
    const { id } = (await made.json()) as { id: string };
    await page.goto(`${BASE}/athletes/${athleteId}/plan?week=${week}`);
    await dragEvent(page, "Drag me", plus(week, 1), plus(week, 4));
    await page.getByText(`Moved "Drag me" to ${plus(week, 4)}.`).waitFor();
    const after = (await (
      await page.request.get(`${BASE}/api/athletes/${athleteId}/sessions?from=${week}&to=${plus(week, 6)}`)
    ).json()) as { id: string; date: string }[];
    expect(after.find((s) => s.id === id)?.date).toBe(plus(week, 4));
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("dragging one occurrence of a repeat moves only it; with 'the series from here on' the rest follow (server state checked)", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.getByRole("link", { name: "Jonas Okafor" }).click();
    await page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const athleteId = page.url().split("/athletes/")[1]!;
    const week = mondayInWeeks(112 + (Math.floor(Date.now() / 1000) % 400));
    const made = await page.request.post(`${BASE}/api/athletes/${athleteId}/sessions`, {
      data: {
        date: plus(week, 1),
        title: "Weekly spin",
        sport: "cycling",
        structure: [{ type: "step", kind: "work", durationS: 2700, zone: 1 }],
        repeat: { byWeekday: ["TU"], count: 3 },
      },
    });
    expect(made.status()).toBe(201);
    const datesOf = async () =>
      (
        (await (
          await page.request.get(`${BASE}/api/athletes/${athleteId}/sessions?from=${week}&to=${plus(week, 27)}`)
        ).json()) as { title: string; date: string }[]
      )
        .filter((x) => x.title === "Weekly spin")
        .map((x) => x.date)
        .sort();
    expect(await datesOf()).toEqual([plus(week, 1), plus(week, 8), plus(week, 15)]);

    // This occurrence only (the default): Tuesday → Thursday of the first week.
    await page.goto(`${BASE}/athletes/${athleteId}/plan?week=${week}`);
    await dragEvent(page, "Weekly spin", plus(week, 1), plus(week, 3));
    await page.getByText(`Moved "Weekly spin" to ${plus(week, 3)}.`).waitFor();
    expect(await datesOf()).toEqual([plus(week, 3), plus(week, 8), plus(week, 15)]);

    // The series from here on: the second week's Tuesday → Wednesday, and the third follows.
    await page.goto(`${BASE}/athletes/${athleteId}/plan?week=${plus(week, 7)}`);
    await page.getByLabel("the series from here on").check();
    await dragEvent(page, "Weekly spin", plus(week, 8), plus(week, 9));
    await page.getByText(`Moved "Weekly spin" to ${plus(week, 9)}.`).waitFor();
    expect(await datesOf()).toEqual([plus(week, 3), plus(week, 9), plus(week, 16)]);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("plans a template for two athletes from the squad week after a preview, takes a template dropped on one athlete's day, and copies a week into the next weeks", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    // A week far beyond the demo season, different on each run.
    const week = mondayInWeeks(120 + (Math.floor(Date.now() / 1000) % 400));
    await page.goto(`${BASE}/roster/week?week=${week}`);
    const planner = page.getByRole("region", { name: "Plan for several athletes" });
    await planner.getByLabel("Template", { exact: true }).selectOption({ label: "Long run 90 min (Running)" });
    await planner.getByLabel("Day", { exact: true }).selectOption(plus(week, 2));
    await planner.getByLabel("Ines Varga").check();
    await planner.getByLabel("Jonas Okafor").check();
    await planner.getByRole("button", { name: "Show each athlete's week" }).click();
    const preview = page.getByTestId("group-preview");
    await preview.waitFor();
    // The long run's 90 minutes in zone 1 on an empty week, for each of the two (template's minutes).
    await expect(preview.getByRole("row").filter({ hasText: "Ines Varga" }).textContent()).resolves.toContain("90 min");
    await expect(preview.getByRole("row").filter({ hasText: "Jonas Okafor" }).textContent()).resolves.toContain(
      "90 min",
    );
    // Jonas rides: the preview names the running template as another sport before anything is planned.
    await expect(page.getByTestId("other-sport").textContent()).resolves.toContain("Jonas Okafor trains cycling");
    expect(await accessibilityProblems(page)).toEqual([]);
    await shot(page, "squad-week-group-plan");
    await planner.getByRole("button", { name: "Plan it for 2 athletes" }).click();
    await page.getByText("Planned 2 sessions for 2 athletes.").waitFor();
    // The squad week's rows now show the session on that day for both.
    await page
      .getByTestId("squad-week-row")
      .filter({ hasText: "Ines Varga" })
      .locator('p[title="Long run 90 min"]')
      .waitFor();
    await page
      .getByTestId("squad-week-row")
      .filter({ hasText: "Jonas Okafor" })
      .locator('p[title="Long run 90 min"]')
      .waitFor();

    // The squad week is editable: a template chip dragged onto Jonas's Friday, and the keyboard path on Ines's Thursday.
    const jonasFriday = page
      .getByTestId("squad-week-row")
      .filter({ hasText: "Jonas Okafor" })
      .locator(`[data-testid="squad-day"][data-date="${plus(week, 4)}"]`);
    const chip = page.getByTestId("squad-template").filter({ hasText: "Long run 90 min" });
    await jonasFriday.scrollIntoViewIfNeeded();
    await chip.dragTo(jonasFriday);
    // A running template on a cyclist's day asks first; "Do not plan it" plans nothing, "Plan it anyway" plans it.
    const question = jonasFriday.getByRole("alertdialog");
    await expect(question.textContent()).resolves.toContain("Jonas Okafor trains cycling");
    await question.getByRole("button", { name: "Do not plan it" }).click();
    await question.waitFor({ state: "detached" });
    expect(await jonasFriday.locator('p[title="Long run 90 min"]').count()).toBe(0);
    await chip.dragTo(jonasFriday);
    await jonasFriday.getByRole("button", { name: "Plan it anyway" }).click();
    // The session's own title (the status line after planning names the template too).
    await jonasFriday.locator('p[title="Long run 90 min"]').waitFor();
    await page.getByRole("button", { name: `+ Plan a template for Ines Varga on ${plus(week, 3)}` }).click();
    await page.getByLabel(`Template for Ines Varga on ${plus(week, 3)}`).selectOption({ label: "Long run 90 min" });
    await page
      .getByTestId("squad-week-row")
      .filter({ hasText: "Ines Varga" })
      .locator(`[data-testid="squad-day"][data-date="${plus(week, 3)}"]`)
      .getByRole("button", { name: "Plan it" })
      .click();
    await page
      .getByTestId("squad-week-row")
      .filter({ hasText: "Ines Varga" })
      .locator(`[data-testid="squad-day"][data-date="${plus(week, 3)}"]`)
      .locator('p[title="Long run 90 min"]')
      .waitFor();
    expect(await accessibilityProblems(page)).toEqual([]);

    // On Ines's plan: copy that week into the next two weeks.
    await page
      .getByTestId("squad-week-row")
      .filter({ hasText: "Ines Varga" })
      .getByRole("link", { name: "Ines Varga" })
      .click();
    await page.waitForURL(/\/plan\?week=/);
    const athleteId = page.url().split("/athletes/")[1]!.split("/")[0]!;
    await page.getByText("Copy a week into the next weeks").click();
    await page.getByLabel("Copy the training sessions of the week of").selectOption(week);
    await page.getByLabel("Into").selectOption({ label: "the next 2 weeks" });
    await page.getByRole("button", { name: "Show those weeks after it" }).click();
    await page
      .getByTestId("copy-preview")
      .getByText(`Week of ${plus(week, 14)}`)
      .waitFor();
    await page.getByRole("button", { name: "Copy it" }).click();
    await page.getByText("Copied 4 sessions into 2 weeks.").waitFor();
    const dates = (
      (await (
        await page.request.get(`${BASE}/api/athletes/${athleteId}/sessions?from=${week}&to=${plus(week, 20)}`)
      ).json()) as { title: string; date: string }[]
    )
      .filter((x) => x.title === "Long run 90 min")
      .map((x) => x.date)
      .sort();
    expect(dates).toEqual([
      plus(week, 2),
      plus(week, 3),
      plus(week, 9),
      plus(week, 10),
      plus(week, 16),
      plus(week, 17),
    ]);
    expect(problems).toEqual([]);
    await page.context().close();
  });
});
