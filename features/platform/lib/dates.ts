/** The calendar day (YYYY-MM-DD) of an instant in an IANA time zone, from Node's Intl time-zone data. */
const formatters = new Map<string, Intl.DateTimeFormat>();

export function localDate(instant: Date, timeZone: string): string {
  let f = formatters.get(timeZone);
  if (!f) formatters.set(timeZone, (f = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" })));
  const parts = f.formatToParts(instant);
  const get = (t: string) => parts.find((p) => p.type === t)!.value;
  return `${get("year")}-${get("month")}-${get("day")}`;
}

/** The range of calendar dates Tidemark accepts anywhere (training plans, tests, queries). */
export const FIRST_YEAR = 1900;
export const LAST_YEAR = 2200;

/** Whether "YYYY-MM-DD" is a real calendar date within FIRST_YEAR–LAST_YEAR (2026-02-30 and 0000-01-01 are not). */
export function isCalendarDate(value: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (y < FIRST_YEAR || y > LAST_YEAR || mo < 1 || mo > 12 || d < 1) return false;
  const leap = (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
  return d <= [31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][mo - 1]!;
}
