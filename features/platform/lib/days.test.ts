import { describe, expect, it } from "vitest";
import { dayNumber, isoOfDay } from "./days";

describe("calendar-day arithmetic (cross-checked against JavaScript's Date, the ECMAScript time value)", () => {
  it("agrees with Date for every day from 1900 to 2200", () => {
    const start = Date.UTC(1900, 0, 1) / 86_400_000,
      end = Date.UTC(2200, 0, 1) / 86_400_000;
    for (let n = start; n <= end; n++) {
      const iso = new Date(n * 86_400_000).toISOString().slice(0, 10);
      if (dayNumber(iso) !== n || isoOfDay(n) !== iso) throw new Error(`mismatch at ${iso}`);
    }
  });

  it("refuses dates that do not exist", () => {
    for (const bad of ["2026-02-29", "2026-13-01", "2026-00-10", "2026-04-31", "2026-1-01", "20261201", "abcd-ef-gh"])
      expect(dayNumber(bad), bad).toBeNaN();
    expect(dayNumber("2028-02-29")).toBe(Date.UTC(2028, 1, 29) / 86_400_000);
  });
});
