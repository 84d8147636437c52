// The everyday story on a fresh account, end to end: a head coach signs up, builds a squad and invites an athlete (the
// invitation arrives through the e-mail fake), tests the athlete, plans a season and a week that breaks its budget and is
// fixed, moves a planned session with the mouse, plans a template for the squad from the squad week, the athlete logs today's session with a FIT file, and seven days before the retest the reminder job sends the
// retest reminder, whose unsubscribe link works. Every page is screenshotted; any console error, failed request or bare
// number without a label or unit fails the story. Check values: the budget maths in features/planning (Seiler &
// Kjerland 2006 shares, "common practice" tolerance), the synthetic ramp model (features/gas-exchange/lib/synthetic-ramp.ts).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { encodeFit } from "@/features/activities/lib/fit-fixture";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import { deliverPending } from "@/features/messages/server/deliver";
import { queueRetestReminders } from "@/features/reminders/server/jobs";
import { query } from "../support/db";
import { accessibilityProblems, BASE, dragEvent, dragTemplate, launch, newPage, shot } from "../support/browser";

const FAKE = process.env.FAKE_EMAIL_URL ?? "";
const tag = Date.now().toString(36);
const COACH = { name: "Ada Strand", email: `ada-${tag}@story.test`, password: "tide-story-pass-1" };
const ATHLETE = { name: "Bo Lindqvist", email: `bo-${tag}@story.test`, password: "tide-story-pass-2" };

const iso = (d: Date) => d.toISOString().slice(0, 10);
const plus = (date: string, n: number) => iso(new Date(Date.parse(`${date}T00:00:00Z`) + n * 86_400_000));
const today = iso(new Date());

let browser: Browser;
beforeAll(async () => {
  if (!FAKE) throw new Error("FAKE_EMAIL_URL is not set: run the browser tests through `npm test`.");
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

/** A bare number (no unit, no label) shown on its own is a defect: every number on screen says what it is. */
async function bareNumbers(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    for (const el of Array.from(document.querySelectorAll("body *"))) {
      if (el.children.length || !(el instanceof HTMLElement) || !el.offsetParent) continue;
      if (
        el.closest(
          "option, select, input, textarea, script, style, svg, [aria-hidden='true'], .fc-daygrid-day-number, .fc-col-header-cell, .fc-toolbar-title",
        )
      )
        continue;
      const text = (el.textContent ?? "").trim();
      if (!/^[−-]?\d+([.,]\d+)?$/.test(text)) continue;
      if (el.getAttribute("aria-label") || el.getAttribute("title")) continue;
      const context = (el.parentElement?.textContent ?? "").replace(text, "");
      if (/[A-Za-z%]/.test(context)) continue;
      const cell = el.closest("td");
      if (cell && cell.closest("table")?.querySelector("th")) continue;
      out.push(`${text} in <${el.tagName.toLowerCase()}> at ${location.pathname}`);
    }
    return out;
  });
}

const step = (n: string) => console.log(`[story] step ${n} at ${new Date().toISOString()}`);

async function visit(page: Page, name: string, problems: string[]) {
  await page.waitForLoadState("networkidle");
  await shot(page, `story-${name}`);
  problems.push(...(await bareNumbers(page)));
  // Every page of the story meets WCAG 2.2 AA as far as axe-core can tell: no serious or critical violation.
  problems.push(...(await accessibilityProblems(page)));
}

async function outbox(): Promise<{ id: string; to: string[]; subject: string; kind: string }[]> {
  return (await fetch(`${FAKE}/outbox.json`)).json();
}
async function messageText(id: string): Promise<string> {
  return (
    (await (await fetch(`${FAKE}/emails/${id}`, { headers: { authorization: "Bearer story" } })).json()) as {
      text: string;
    }
  ).text;
}

/** Delivers what is queued, then reads the newest address-confirmation link sent to `email` from the e-mail fake. */
async function verificationLink(email: string): Promise<string> {
  await deliverPending(new Date());
  const message = (await outbox()).find((m) => m.kind === "email_verification" && m.to.includes(email));
  expect(message, `a confirmation message to ${email}`).toBeTruthy();
  return /https?:\/\/\S+\/api\/auth\/verify-email\S+/.exec(await messageText(message!.id))![0];
}

describe("the everyday story", () => {
  it("sign-up, squad, invitation, test, season, budget fix, today's log with a file, and the retest reminder", async () => {
    step("1");
    // 1. A head coach signs up, creates a squad and invites an athlete.
    const coach = await newPage(browser);
    const c = coach.page;
    const first = await c.goto(`${BASE}/sign-up`);
    // The security headers are on every page (and the pages pass their content security policy: no console errors).
    expect(first!.headers()["content-security-policy"]).toMatch(/frame-ancestors 'none'/);
    expect(first!.headers()["x-frame-options"]).toBe("DENY");
    await visit(c, "01-sign-up", coach.problems);
    await c.getByLabel("Your name").fill(COACH.name);
    await c.getByLabel("E-mail").fill(COACH.email);
    await c.getByLabel(/^Password/).fill(COACH.password);
    await c.getByRole("button", { name: "Create account" }).click();
    // The account works once the address is confirmed: the link arrives by e-mail and signs in.
    await c.getByRole("heading", { name: "Check your inbox" }).waitFor();
    await visit(c, "01b-check-inbox", coach.problems);
    await c.goto(await verificationLink(COACH.email));
    await c.waitForURL(/\/squads\/new/);
    await visit(c, "02-new-squad", coach.problems);
    await c.getByLabel("Squad name").fill("Harbour Runners");
    await c.getByRole("button", { name: "Create the squad" }).click();
    await c.waitForURL(/\/roster/);
    await c.getByLabel("E-mail").fill(ATHLETE.email);
    await c.getByLabel("Role").selectOption("athlete");
    await c.getByRole("button", { name: "Send invitation" }).click();
    await c.getByText(ATHLETE.email).first().waitFor();
    await visit(c, "03-roster-invited", coach.problems);

    // The invitation arrives in the e-mail fake's outbox (the worker's delivery, run here in-process).
    await deliverPending(new Date());
    const invitation = (await outbox()).find((m) => m.kind === "invitation" && m.to.includes(ATHLETE.email));
    expect(invitation?.subject).toMatch(/Harbour Runners/);
    const inviteUrl = /https?:\/\/\S+\/invite\/\S+/.exec(await messageText(invitation!.id))![0];

    // The athlete accepts: an account with a password, then time zone and reminder time.
    const athlete = await newPage(browser);
    const a = athlete.page;
    await a.goto(inviteUrl);
    await visit(a, "04-invitation", athlete.problems);
    await a.getByLabel("Your name").fill(ATHLETE.name);
    await a.getByLabel(/^Password/).fill(ATHLETE.password);
    await a
      .getByRole("button", { name: /Create account|Join/ })
      .first()
      .click();
    await a.getByRole("heading", { name: "Check your inbox" }).waitFor();
    // The confirmation link signs the athlete in and brings them back to the invitation.
    await a.goto(await verificationLink(ATHLETE.email));
    await a.waitForURL(/\/invite\//);
    await a.getByRole("button", { name: "Join the squad" }).click();
    await a.waitForURL(/\/settings/);
    await a.getByLabel("Time zone").selectOption("Europe/Oslo");
    await a.getByLabel("Running").check();
    await a.getByLabel("Session reminders").selectOption("morning_of");
    await a.getByLabel(/^At/).fill("07:00");
    await a.getByRole("button", { name: "Save my profile" }).click();
    await a.getByText(/Saved/).first().waitFor();
    await visit(a, "05-athlete-settings", athlete.problems);
    // Before any test the athlete answers the readiness questions (all no here).
    await a.getByRole("link", { name: "Today" }).click();
    await a.waitForURL(/\/today/);
    await a.getByTestId("readiness-banner").getByRole("link", { name: "Answer the readiness questions" }).click();
    await a.waitForURL(/\/screening$/);
    const noes = a.getByRole("radio", { name: "No" });
    await noes.first().waitFor();
    for (let i = 0; i < (await noes.count()); i++) await noes.nth(i).check();
    await a.getByRole("button", { name: "Save the answers" }).click();
    await a.getByText("Saved. No answer needs medical clearance.").waitFor();
    await visit(a, "05b-readiness", athlete.problems);

    step("2");
    // 2. The coach records a gas-exchange test, drags VT2, saves; the zone set appears for coach and athlete.
    await c.goto(`${BASE}/roster`);
    await c.getByRole("link", { name: ATHLETE.name }).click();
    await c.waitForURL(/\/athletes\/[^/?]+$/);
    const athleteId = c.url().split("/athletes/")[1]!;
    await visit(c, "06-athlete", coach.problems);
    await c.getByRole("link", { name: "Upload a gas-exchange test" }).click();
    const csv = syntheticRamp({ seed: 21, massKg: 68, peakW: 320 }).csv;
    await c.locator("#gas-file").setInputFiles({ name: "bo-ramp.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await c.getByRole("heading", { name: "2. Check the columns" }).waitFor();
    await c.getByLabel("Sport").selectOption("running");
    await c.getByLabel(/^Protocol/).fill("treadmill ramp, 0.5 km/h per minute");
    await visit(c, "07-test-upload", coach.problems);
    await c.getByRole("button", { name: "Analyse and save the test" }).click();
    await c.waitForURL(/\/tests\/[0-9a-f-]+$/);
    await c.getByRole("heading", { name: "Thresholds" }).waitFor();
    const vt2Before = Number((await c.getByTestId("VT2-hr").textContent())!.match(/(\d+) bpm/)![1]);
    const marker = c.locator('figure:has-text("Heart rate over time") [data-marker="vt2"] line');
    await marker.scrollIntoViewIfNeeded();
    const box = (await marker.boundingBox())!;
    await c.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await c.mouse.down();
    await c.mouse.move(box.x - 40, box.y + box.height / 2, { steps: 8 });
    await c.mouse.up();
    const vt2After = Number((await c.getByTestId("VT2-hr").textContent())!.match(/(\d+) bpm/)![1]);
    expect(vt2After).toBeLessThan(vt2Before);
    await c.getByRole("button", { name: "Save thresholds and zones" }).click();
    await c.getByText("Saved. The zone set now uses these thresholds").waitFor();
    await visit(c, "08-test-result", coach.problems);
    await a.goto(`${BASE}/zones`);
    await a.getByText(`${vt2After} bpm`).first().waitFor();
    await visit(a, "09-athlete-zones", athlete.problems);

    step("3");
    // 3. A season, an interval template, and a week dragged over budget, then fixed.
    await c.goto(`${BASE}/athletes/${athleteId}/plan`);
    await c.getByLabel("Season name").fill("Autumn half marathon");
    await c.getByLabel("Start").fill(today);
    await c.getByLabel("Target event").fill("Harbour half marathon");
    await c.getByLabel("Event date").fill(plus(today, 26 * 7));
    // A second event on the way, of priority B (a short taper, an easier week after).
    await c.getByRole("button", { name: "Add an event" }).click();
    await c.getByLabel("Event 2", { exact: true }).fill("Harbour 10 km");
    await c.getByLabel("Event 2 date").fill(plus(today, 12 * 7));
    await expect(c.getByLabel("Event 2 priority").inputValue()).resolves.toBe("B");
    await c.getByLabel("Weekly hours now (h)").fill("6");
    await c.getByRole("button", { name: "Generate the season" }).click();
    await c.getByRole("region", { name: /Season ribbon/ }).waitFor();
    await visit(c, "10-season", coach.problems);
    await c.goto(`${BASE}/templates`);
    await c.getByLabel("Name").fill("Harbour intervals 6 × 4 min");
    await c.getByLabel("Block 2 repeats").fill("6");
    await visit(c, "11-template-builder", coach.problems);
    await c.getByRole("button", { name: "Save the template" }).click();
    await c.getByText("Harbour intervals 6 × 4 min").first().waitFor();
    // Two easy long runs in the target week and the next (through the API, as the coach). The target week is a loading
    // week followed by another, so that a fix may move a session there (never into an unloading, taper or race week).
    const seasons = (await (await c.request.get(`${BASE}/api/athletes/${athleteId}/seasons`)).json()) as {
      weeks: { weekStart: string; role: string; budget: string }[];
    }[];
    const sw = seasons[0]!.weeks;
    // Both events are in the season: the B race week is an event week, the week after it an easier one.
    const bWeek = sw.findIndex((w) => (w as unknown as { events: string[] }).events.includes("Harbour 10 km"));
    expect(bWeek).toBeGreaterThan(0);
    expect(sw[bWeek]!.role).toBe("event");
    expect(sw[bWeek + 1]!.role).toBe("unloading");
    expect(sw.some((w) => (w as unknown as { events: string[] }).events.includes("Harbour half marathon"))).toBe(true);
    const at = sw.findIndex(
      (w, i) =>
        i >= 1 &&
        w.weekStart > plus(today, 7) &&
        w.role === "loading" &&
        w.budget === "pyramidal" &&
        sw[i + 1]?.role === "loading" &&
        sw[i + 1]?.budget === "pyramidal",
    );
    expect(at).toBeGreaterThan(0);
    const week = sw[at]!.weekStart;
    for (const d of [plus(week, 5), plus(week, 6), plus(week, 12), plus(week, 13)]) {
      const r = await c.request.post(`${BASE}/api/athletes/${athleteId}/sessions`, {
        data: {
          date: d,
          title: "Easy long run",
          sport: "running",
          structure: [{ type: "step", kind: "work", durationS: 90 * 60, zone: 1 }],
        },
      });
      expect(r.status()).toBe(201);
    }
    await c.goto(`${BASE}/athletes/${athleteId}/plan?week=${week}`);
    const band = c.getByTestId(`band-${week}`);
    await band.waitFor();
    // Each interval session: 43 min zone 1, 24 min zone 3. With 180 easy minutes, two make zone 3 48 of 314 min = 15.3 %,
    // over the 10 % ± 5 of this block's pyramidal budget (hand computation); drag until the band says so.
    let dragged = 0;
    while ((await band.getAttribute("data-over")) !== "yes" && dragged < 4) {
      dragged++;
      await dragTemplate(c, "Harbour intervals 6 × 4 min", plus(week, dragged - 1));
      await c
        .locator(`td.fc-day[data-date="${plus(week, dragged - 1)}"] .fc-event`, { hasText: "Harbour intervals" })
        .waitFor();
      await c.getByText(`Planned "Harbour intervals 6 × 4 min" on ${plus(week, dragged - 1)}.`).waitFor();
    }
    await c.locator(`[data-testid="band-${week}"][data-over="yes"]`).waitFor();
    expect(dragged).toBe(2);
    await expect(band.textContent()).resolves.toMatch(
      /Zone 3 is 15\.3 % of the week; the pyramidal budget allows 15 %/,
    );
    await visit(c, "12-week-over-budget", coach.problems);
    await band.getByRole("button", { name: "Apply the fix" }).click();
    await c.locator(`[data-testid="band-${week}"][data-over="no"]`).waitFor();
    await visit(c, "13-week-fixed", coach.problems);

    // A planned session moves to another day with the mouse, and the server has it there.
    await dragEvent(c, "Easy long run", plus(week, 5), plus(week, 4));
    await c.getByText(`Moved "Easy long run" to ${plus(week, 4)}.`).waitFor();
    const inWeek = (await (
      await c.request.get(`${BASE}/api/athletes/${athleteId}/sessions?from=${week}&to=${plus(week, 6)}`)
    ).json()) as { title: string; date: string }[];
    expect(inWeek.filter((x) => x.title === "Easy long run").map((x) => x.date)).toEqual([
      plus(week, 4),
      plus(week, 6),
    ]);

    // Planning for the squad: from the squad week, a template for the squad's athletes on one day, after the preview.
    const squadDay = plus(week, 7 * 8 + 2);
    await c.goto(`${BASE}/roster/week?week=${plus(week, 7 * 8)}`);
    const planner = c.getByRole("region", { name: "Plan for several athletes" });
    await planner
      .getByLabel("Template", { exact: true })
      .selectOption({ label: "Harbour intervals 6 × 4 min (Running)" });
    await planner.getByLabel("Day", { exact: true }).selectOption(squadDay);
    await planner.getByLabel(/^All /).check();
    await planner.getByRole("button", { name: "Show each athlete's week" }).click();
    await c.getByTestId("group-preview").getByRole("row").filter({ hasText: ATHLETE.name }).waitFor();
    await visit(c, "13b-squad-week-preview", coach.problems);
    await planner.getByRole("button", { name: /^Plan it for 1 athlete$/ }).click();
    await c.getByText("Planned 1 session for 1 athlete.").waitFor();
    const squadPlanned = (await (
      await c.request.get(`${BASE}/api/athletes/${athleteId}/sessions?from=${squadDay}&to=${squadDay}`)
    ).json()) as { title: string }[];
    expect(squadPlanned.map((x) => x.title)).toEqual(["Harbour intervals 6 × 4 min"]);

    // Today's session for the athlete, planned with the keyboard planner.
    await c.goto(`${BASE}/athletes/${athleteId}/plan?week=${today}`);
    await c.getByText("Plan without dragging").click();
    await c.getByLabel("Template", { exact: true }).selectOption({ label: "Harbour intervals 6 × 4 min" });
    await c.getByLabel("Day", { exact: true }).fill(today);
    await c.getByRole("button", { name: "Plan it" }).click();
    await c.getByText(`Planned "Harbour intervals 6 × 4 min" on ${today}.`).waitFor();

    step("4");
    // 4. The athlete opens today, sees targets in their own heart rate, logs it with RPE 6 and a FIT file.
    await a.setViewportSize({ width: 390, height: 844 });
    await a.goto(`${BASE}/today`);
    const card = a.getByTestId("session-card").filter({ hasText: "Harbour intervals" }).first();
    await card.waitFor();
    await expect(card.innerText()).resolves.toMatch(/bpm/);
    await visit(a, "14-today", athlete.problems);
    await card.getByLabel("Done", { exact: true }).check();
    await card.getByLabel("Effort, whole session (RPE 0–10)").selectOption("6");
    await card.getByRole("button", { name: "Save the log" }).click();
    await card.getByTestId("log-summary").filter({ hasText: "RPE 6" }).waitFor();
    const start = new Date(`${today}T06:30:00Z`);
    const seconds = Array.from({ length: 67 * 60 }, (_, i) => ({
      hrBpm: i < 15 * 60 || i > 57 * 60 ? 128 : (i - 15 * 60) % 420 < 240 ? vt2After + 4 : 135,
      speedKmh: 11,
    }));
    const fit = encodeFit({ start, sport: "running", seconds });
    await card
      .locator('input[type="file"]')
      .setInputFiles({ name: "bo-intervals.fit", mimeType: "application/octet-stream", buffer: Buffer.from(fit) });
    await card
      .getByText(/measured/i)
      .first()
      .waitFor();
    await visit(a, "15-today-logged", athlete.problems);

    // The coach sees it done with measured time in zone on the calendar and in the roster.
    await c.goto(`${BASE}/athletes/${athleteId}/plan?week=${today}`);
    const done = c.locator('[data-testid="calendar-event"][data-log="done"]').first();
    await done.waitFor();
    await done.click();
    await expect(c.getByTestId("selected-log").innerText()).resolves.toMatch(/measured z1 \d+ · z2 \d+ · z3 \d+ min/);
    await visit(c, "16-calendar-done", coach.problems);
    await c.goto(`${BASE}/roster`);
    const row = c.getByTestId("roster-row").filter({ hasText: ATHLETE.name });
    await expect(row.getByTestId("compliance").innerText()).resolves.toMatch(/\d+ %/);
    await visit(c, "17-roster", coach.problems);

    step("5");
    // 5. Seven days before the retest the job runs; the reminder goes to the athlete with the date and a working link.
    const [retest] = await query<{ date: string }>(
      `select min(date) as date from planned_session where athlete_id = $1 and kind = 'retest' and date > $2`,
      [athleteId, today],
    );
    expect(retest?.date).toBeTruthy();
    const clock = new Date(`${plus(retest!.date, -7)}T12:00:00Z`); // 13:00 in Oslo, after the 07:00 reminder time
    expect(await queueRetestReminders(clock)).toBeGreaterThanOrEqual(1);
    await deliverPending(new Date());
    const reminder = (await outbox()).find((m) => m.kind === "retest_reminder" && m.to.includes(ATHLETE.email));
    expect(reminder?.subject).toMatch(/^Retest in a week: /);
    const text = await messageText(reminder!.id);
    const [y, mo, d] = retest!.date.split("-").map(Number) as [number, number, number];
    // The athlete never chose a date style, so the e-mail writes the day in ISO 8601 after its weekday (CLDR en weekday name via Intl).
    const weekday = new Intl.DateTimeFormat("en-GB", { weekday: "long", timeZone: "UTC" }).format(
      new Date(Date.UTC(y, mo - 1, d)),
    );
    expect(text).toContain(`${weekday} ${retest!.date}`);
    const unsubscribe = /https?:\/\/\S+\/unsubscribe\/\S+/.exec(text)![0];
    const reader = await newPage(browser);
    await reader.page.goto(unsubscribe);
    // Opening the link only asks: a mail scanner following it changes nothing.
    await reader.page.getByRole("heading", { name: "Stop retest reminders?" }).waitFor();
    await visit(reader.page, "18a-unsubscribe-asks", reader.problems);
    const [before] = await query<{ remind_retests: boolean }>(
      `select remind_retests from athlete_profile where user_id = $1`,
      [athleteId],
    );
    expect(before?.remind_retests).toBe(true);
    await reader.page.getByRole("button", { name: "Turn off retest reminders" }).click();
    await reader.page.getByRole("heading", { name: "Turned off: retest reminders" }).waitFor();
    await visit(reader.page, "18-unsubscribed", reader.problems);
    const [profile] = await query<{ remind_retests: boolean }>(
      `select remind_retests from athlete_profile where user_id = $1`,
      [athleteId],
    );
    expect(profile?.remind_retests).toBe(false);

    expect(coach.problems).toEqual([]);
    expect(athlete.problems).toEqual([]);
    expect(reader.problems).toEqual([]);
  }, 300_000);
});
