// Real calendar dates (Gregorian leap years: every 4th year, not centuries, except every 400th) within 1900–2200.
import { describe, expect, it } from "vitest";
import { isoDate } from "./date-schema";

describe("isoDate", () => {
  it("takes real dates, leap days included", () => {
    for (const d of ["2026-12-03", "2028-02-29", "2000-02-29", "1900-01-01", "2200-12-31"])
      expect(isoDate.safeParse(d).success, d).toBe(true);
  });
  it("refuses impossible dates and years outside 1900–2200, with a reason", () => {
    for (const d of [
      "2026-02-30",
      "2026-02-29",
      "1900-02-29",
      "2026-04-31",
      "2026-13-01",
      "2026-00-10",
      "0000-01-01",
      "9999-12-31",
      "1899-12-31",
      "2201-01-01",
      "2026-1-1",
      "20261203",
    ]) {
      const r = isoDate.safeParse(d);
      expect(r.success, d).toBe(false);
      expect(r.error!.issues[0]!.message).toMatch(/YYYY-MM-DD|real calendar date/);
    }
  });
});
