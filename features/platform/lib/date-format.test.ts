import { describe, expect, it } from "vitest";
import { DATE_STYLES, dateStyleOf, formatDay, formatDayRange, localiseDates } from "./date-format";

/** The order of day, month and year in a locale's medium date, from the runtime's CLDR data (Intl.DateTimeFormat). */
function cldrOrder(locale: string, weekday: boolean): string[] {
  return new Intl.DateTimeFormat(locale, {
    timeZone: "UTC",
    day: "numeric",
    month: "short",
    year: "numeric",
    ...(weekday ? { weekday: "short" } : {}),
  })
    .formatToParts(new Date(Date.UTC(2026, 2, 9)))
    .filter((p) => p.type !== "literal")
    .map((p) => p.type);
}

function ourOrder(text: string): string[] {
  return text
    .split(/[ ,]+/)
    .filter(Boolean)
    .map((w) => (/^\d{4}$/.test(w) ? "year" : /^\d+$/.test(w) ? "day" : w === "Mon" ? "weekday" : "month"));
}

describe("formatDay", () => {
  it("keeps ISO 8601 calendar dates as they are (ISO 8601-1:2019, extended format YYYY-MM-DD)", () => {
    expect(formatDay("2026-03-09", "iso")).toBe("2026-03-09");
    expect(formatDay("2026-03-09", "iso", { weekday: true })).toBe("Mon 2026-03-09");
    expect(formatDay("2026-03-09", "iso", { year: false })).toBe("03-09");
  });

  it("writes day before month and month before day in the CLDR order of en-GB and en-US", () => {
    expect(formatDay("2026-03-09", "day-month")).toBe("9 Mar 2026");
    expect(formatDay("2026-03-09", "month-day")).toBe("Mar 9, 2026");
    for (const weekday of [false, true]) {
      expect(ourOrder(formatDay("2026-03-09", "day-month", { weekday }))).toEqual(cldrOrder("en-GB", weekday));
      expect(ourOrder(formatDay("2026-03-09", "month-day", { weekday }))).toEqual(cldrOrder("en-US", weekday));
    }
    // en-US writes exactly this (CLDR medium date with a short weekday); en-GB's month name for September differs.
    const us = new Intl.DateTimeFormat("en-US", {
      timeZone: "UTC",
      weekday: "short",
      month: "short",
      day: "numeric",
      year: "numeric",
    });
    for (const d of ["2026-01-01", "2026-03-09", "2027-12-31", "2028-02-29"])
      expect(formatDay(d, "month-day", { weekday: true })).toBe(us.format(new Date(`${d}T00:00:00Z`)));
  });

  it("gives the weekday of the date itself, whatever the time zone of the machine (2026-03-09 was a Monday)", () => {
    expect(formatDay("2026-03-09", "day-month", { weekday: true })).toBe("Mon 9 Mar 2026");
    expect(formatDay("2026-03-15", "month-day", { weekday: true, year: false })).toBe("Sun, Mar 15");
  });

  it("leaves anything that is not a calendar date alone and reads unknown styles as ISO", () => {
    expect(formatDay("next week", "day-month")).toBe("next week");
    expect(formatDay("2026-3-9", "month-day")).toBe("2026-3-9");
    expect(dateStyleOf("klingon")).toBe("iso");
    expect(dateStyleOf(undefined)).toBe("iso");
    for (const s of DATE_STYLES) expect(dateStyleOf(s)).toBe(s);
  });
});

describe("ranges and sentences", () => {
  it("says the year once inside one year", () => {
    expect(formatDayRange("2026-03-09", "2026-03-15", "iso")).toBe("2026-03-09 – 2026-03-15");
    expect(formatDayRange("2026-03-09", "2026-03-15", "day-month")).toBe("9 Mar – 15 Mar 2026");
    expect(formatDayRange("2026-12-28", "2027-01-03", "month-day")).toBe("Dec 28, 2026 – Jan 3, 2027");
    expect(formatDayRange("2026-03-09", "2026-03-09", "month-day")).toBe("Mar 9, 2026");
  });

  it("puts every ISO date of a server sentence in the reader's style and nothing else", () => {
    const s = 'Move "Hills 6×3" to 2026-03-11: both weeks then keep their budget (ref 2026-03-110).';
    expect(localiseDates(s, "day-month")).toBe(
      'Move "Hills 6×3" to 11 Mar 2026: both weeks then keep their budget (ref 2026-03-110).',
    );
    expect(localiseDates(s, "iso")).toBe(s);
  });
});
