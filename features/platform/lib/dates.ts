import { dayNumber } from "./days";
/** The calendar day (YYYY-MM-DD) of an instant in an IANA time zone, from Node's Intl time-zone data. */
const formatters = new Map<string, Intl.DateTimeFormat>();

export function localDate(instant: Date, timeZone: string): string {
  let f = formatters.get(timeZone);
  if (!f)
    formatters.set(
      timeZone,
      (f = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" })),
    );
  const parts = f.formatToParts(instant);
  const get = (t: string) => parts.find((p) => p.type === t)!.value;
  return `${get("year")}-${get("month")}-${get("day")}`;
}

/** The range of calendar dates Tidemark accepts anywhere (training plans, tests, queries). */
export const FIRST_YEAR = 1900;
export const LAST_YEAR = 2200;

/** Whether "YYYY-MM-DD" is a real calendar date within FIRST_YEAR–LAST_YEAR (2026-02-30 and 0000-01-01 are not). */
export function isCalendarDate(value: string): boolean {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(value)) return false;
  const y = Number(value.slice(0, 4));
  // The one calendar check (days.ts: dayNumber is NaN for an impossible date).
  return y >= FIRST_YEAR && y <= LAST_YEAR && !Number.isNaN(dayNumber(value));
}
