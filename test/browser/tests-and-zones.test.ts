// A coach uploads a gas-exchange file, confirms the columns, moves the test segment and back, drags VT1, saves, and the
// athlete sees the same zones.
// The file comes from the documented synthetic ramp model (features/gas-exchange/lib/synthetic-ramp.ts).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import { accessibilityProblems, launch, newPage, shot, signIn } from "../support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("gas-exchange test in the browser", () => {
  it("upload → mapping → drag VT1 → save → zones for coach and athlete", async () => {
    const { page, problems } = await newPage(browser);
    await signIn(page, "coach@northfold.test");
    await page.getByRole("link", { name: "Ines Varga" }).click();
    await page.getByRole("link", { name: "Upload a gas-exchange test" }).click();
    await page.getByRole("heading", { name: "Upload a gas-exchange test" }).waitFor();
    // Common header variants and L/min, so the mapping step has something to show.
    const csv = syntheticRamp({
      seed: 8,
      massKg: 56,
      peakW: 300,
      headers: ["Time", "VO2", "VCO2", "VE", "HR", "Load", "BF"],
      litres: true,
    }).csv;
    await page
      .locator("#gas-file")
      .setInputFiles({ name: "ines-ramp.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
    await page.getByRole("heading", { name: "2. Check the columns" }).waitFor();
    await expect(page.getByLabel("Column for VO2").inputValue()).resolves.toBe("VO2");
    await expect(page.getByLabel("Column for power").inputValue()).resolves.toBe("Load");
    await page.getByText("L/min (from the values)").first().waitFor();
    await page.getByLabel("Sport").selectOption("cycling");
    await page.getByLabel(/^Protocol/).fill("cycle ergometer ramp, 25 W/min");
    await shot(page, "test-upload");
    await page.getByRole("button", { name: "Analyse and save the test" }).click();
    await page.waitForURL(/\/tests\/[0-9a-f-]+$/);
    await page.getByRole("heading", { name: "Thresholds" }).waitFor();

    // The test segment: drag its start later with the mouse, search again, then give the segment back to the finder.
    await page.getByText("Tidemark found the test segment from the workload.").waitFor();
    const rangeBefore = await page.getByTestId("segment-range").textContent();
    const start = page.locator('figure:has-text("VO2 over the whole file") [data-marker="segment-start"] line');
    await start.scrollIntoViewIfNeeded();
    const sb = (await start.boundingBox())!;
    await page.mouse.move(sb.x + sb.width / 2, sb.y + sb.height / 2);
    await page.mouse.down();
    await page.mouse.move(sb.x + 50, sb.y + sb.height / 2, { steps: 8 });
    await page.mouse.up();
    const rangeMoved = await page.getByTestId("segment-range").textContent();
    expect(rangeMoved).not.toBe(rangeBefore);
    await page.getByRole("button", { name: "Find the thresholds in this segment" }).click();
    await page.getByText("A coach set this test segment by hand.").waitFor();
    await expect(page.getByTestId("segment-range").textContent()).resolves.toBe(rangeMoved);
    await page.getByText(`Exercise analysed`).waitFor();
    await page.getByRole("button", { name: "Let Tidemark find the segment again" }).click();
    await page.getByText("Tidemark found the test segment from the workload.").waitFor();
    await expect(page.getByTestId("segment-range").textContent()).resolves.toBe(rangeBefore);

    const hrBefore = await page.getByTestId("VT1-hr").textContent();
    const marker = page.locator('figure:has-text("Heart rate over time") [data-marker="vt1"] line');
    await marker.scrollIntoViewIfNeeded();
    const box = (await marker.boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + 60, box.y + box.height / 2, { steps: 8 });
    await page.mouse.up();
    const hrAfter = await page.getByTestId("VT1-hr").textContent();
    expect(hrAfter).not.toBe(hrBefore);
    const newHr = Number(hrAfter!.match(/(\d+) bpm/)![1]);
    expect(newHr).toBeGreaterThan(Number(hrBefore!.match(/(\d+) bpm/)![1]));

    await page.getByRole("button", { name: "Save thresholds and zones" }).click();
    await page.getByText("Saved. The zone set now uses these thresholds").waitFor();
    // Zone 1 ends a step below the new VT1 (from its light-intensity floor when the athlete's maximum is known).
    const zoneOne = new RegExp(`(below ${newHr}|\\d+–${newHr - 1}) bpm`);
    await page.getByText(zoneOne).first().waitFor();
    await shot(page, "test-result");
    expect(await accessibilityProblems(page)).toEqual([]);
    expect(problems).toEqual([]);
    await page.context().close();

    const athlete = await newPage(browser);
    await signIn(athlete.page, "runner@northfold.test");
    await athlete.page.getByRole("link", { name: "My zones", exact: true }).click();
    await athlete.page.getByRole("heading", { name: "My zones" }).waitFor();
    await athlete.page.getByText(zoneOne).first().waitFor();
    await expect(athlete.page.getByText(/Cycling · effective from/).count()).resolves.toBe(1);
    await shot(athlete.page, "athlete-zones");
    expect(await accessibilityProblems(athlete.page)).toEqual([]);
    expect(athlete.problems).toEqual([]);
    await athlete.page.context().close();
  });
});
