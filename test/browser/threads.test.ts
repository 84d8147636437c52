// A conversation on a session, in the browser: the demo runner writes about today's session on a phone; the demo coach
// finds "1 new message" on the roster, follows it to the athlete's page, reads and answers; the runner sees the answer.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { accessibilityProblems, BASE, launch, newPage, shot, SHOTS, signIn } from "../support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("conversations on sessions", () => {
  it("the athlete writes on today's session, the coach sees it as new on the roster, answers, and the athlete reads it", async () => {
    const note = "Calf felt tight on the last rep. Easy tomorrow, or the intervals as planned?";
    const athlete = await newPage(browser);
    await athlete.page.setViewportSize({ width: 390, height: 844 });
    await signIn(athlete.page, "runner@northfold.test");
    await athlete.page.goto(`${BASE}/today`);
    const thread = athlete.page.getByTestId("session-card").first().getByTestId("thread");
    await thread.getByText("Messages about this session").click();
    await thread
      .getByText(/No messages yet|\(coach\)|Ines Varga/)
      .first()
      .waitFor();
    await thread.getByLabel("Write a message").fill(note);
    await thread.getByRole("button", { name: "Send" }).click();
    await thread.getByText(note).waitFor();
    expect(athlete.problems).toEqual([]);

    const coach = await newPage(browser);
    await signIn(coach.page, "coach@northfold.test");
    await coach.page.goto(`${BASE}/roster`);
    const row = coach.page.getByTestId("roster-row").filter({ hasText: "Ines Varga" });
    await row.getByTestId("unread-messages").click();
    await coach.page.waitForURL(/\/athletes\/[0-9a-f-]+#messages$/);
    const messages = coach.page.getByRole("region", { name: "Messages" });
    const item = messages.getByRole("listitem").filter({ hasText: note }).first();
    await item.getByText("1 new").waitFor();
    await item.getByText("Read and answer").click();
    const conversation = item.getByTestId("thread");
    await conversation.getByText("new", { exact: true }).waitFor();
    await conversation.getByLabel("Write a message").fill("Ease off tomorrow: 30 min easy, then tell me how it feels.");
    await conversation.getByRole("button", { name: "Send" }).click();
    await conversation.getByText("Ease off tomorrow").waitFor();
    await shot(coach.page, "thread-coach");
    expect(await accessibilityProblems(coach.page)).toEqual([]);
    expect(coach.problems).toEqual([]);

    // The athlete opens the conversation again: the coach's answer, marked new.
    await athlete.page.reload();
    const again = athlete.page.getByTestId("session-card").first().getByTestId("thread");
    await again.getByText("Messages about this session").click();
    await again.getByText("Ease off tomorrow").waitFor();
    await expect(again.innerText()).resolves.toMatch(/\(coach\)[\s\S]*new/);
    await shot(athlete.page, "thread-phone");
    await athlete.page
      .getByTestId("session-card")
      .first()
      .screenshot({ path: `${SHOTS}/thread-card.png` });

    // The same athlete's week on the phone reads as an agenda, and their page offers the downloads (for the tour).
    await athlete.page.getByRole("link", { name: "My plan and calendar" }).click();
    await athlete.page.waitForURL(/\/plan/);
    const agenda = athlete.page.getByTestId("week-agenda");
    await agenda.getByRole("listitem").first().waitFor();
    await agenda.screenshot({ path: `${SHOTS}/week-agenda-phone.png` });
    await athlete.page.goto(`${BASE}/today`);
    await athlete.page.getByRole("link", { name: "My zones, tests and load" }).click();
    await athlete.page.waitForURL(/\/athletes\/[0-9a-f-]+$/);
    const downloads = athlete.page.getByTestId("downloads");
    await downloads.getByRole("link", { name: "Plan, a year back and ahead as Excel workbook" }).waitFor();
    await downloads.screenshot({ path: `${SHOTS}/downloads.png` });
    expect(athlete.problems).toEqual([]);
  });
});
