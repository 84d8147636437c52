// The demo in a real browser: Debian's chromium driven by playwright-core against the production build.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { accessibilityProblems, BASE, launch, newPage, shot, signIn } from "../support/browser";

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

describe("demo sign-ins", () => {
  it("the head coach sees the roster of six athletes", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    expect(page.url()).toBe(`${BASE}/roster`);
    await page.getByTestId("roster-row").first().waitFor();
    await expect(page.getByTestId("roster-row").count()).resolves.toBe(6);
    await expect(page.getByRole("heading", { level: 1 }).textContent()).resolves.toBe("Northfold Endurance");
    await expect(page.getByText("Ines Varga").isVisible()).resolves.toBe(true);
    await shot(page, "roster");
    expect(await accessibilityProblems(page)).toEqual([]);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("settings offer every account its own name and a password change, readable and accessible", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.goto(`${BASE}/settings`);
    const account = page.getByRole("region", { name: "Your account" });
    await expect(account.getByLabel("Your name").inputValue()).resolves.toBe("Maren Holt");
    await account.getByLabel("Current password").waitFor();
    // The client checks before anything is sent: the two new passwords must match.
    await account.getByLabel("Current password").fill("northfold-demo");
    await account.getByLabel(/^New password \(/).fill("a-long-new-password");
    await account.getByLabel("New password again").fill("a-different-password");
    await account.getByRole("button", { name: "Change my password" }).click();
    await account.getByText("The two new passwords differ.").waitFor();
    await shot(page, "settings-account");
    expect(await accessibilityProblems(page)).toEqual([]);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("an athlete lands on today and is refused the roster", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "runner@northfold.test");
    expect(page.url()).toBe(`${BASE}/today`);
    await page.getByRole("heading", { name: "Hello, Ines" }).waitFor();
    await shot(page, "today");
    expect(await accessibilityProblems(page)).toEqual([]);
    await page.goto(`${BASE}/roster`);
    await page.getByRole("heading", { name: "The roster is for coaches" }).waitFor();
    await expect(page.getByTestId("roster-row").count()).resolves.toBe(0);
    expect(problems).toEqual([]);
    await page.context().close();
  });

  it("a wrong password shows a clear message and stays on sign-in", async () => {
    const { page } = await newPage(browser);
    await page.goto(`${BASE}/sign-in`);
    await page.getByLabel("E-mail").fill("coach@northfold.test");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText("That e-mail and password do not match an account.").waitFor();
    expect(page.url()).toBe(`${BASE}/sign-in`);
    await page.context().close();
  });
});
