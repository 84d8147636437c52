/**
 * How a person reads calendar dates. Tidemark stores and sends every date as ISO 8601 (YYYY-MM-DD); a person chooses how
 * pages and e-mails show them: ISO 8601 itself, day before month ("9 Mar 2026", as in most of Europe) or month before day
 * ("Mar 9, 2026", as in the United States). The two written forms follow the order of the CLDR conventions for en-GB and
 * en-US (checked against Intl.DateTimeFormat in date-format.test.ts); they are spelled from fixed English names here, not
 * by Intl, so the server's and the browser's copies of the locale data can never render a page two ways. Downloads keep
 * ISO dates, so spreadsheets and other programs read them as dates.
 */

export const DATE_STYLES = ["iso", "day-month", "month-day"] as const;
export type DateStyle = (typeof DATE_STYLES)[number];

export function isDateStyle(value: unknown): value is DateStyle {
  return typeof value === "string" && (DATE_STYLES as readonly string[]).includes(value);
}

/** A stored value read safely: anything unknown reads as ISO. */
export function dateStyleOf(value: unknown): DateStyle {
  return isDateStyle(value) ? value : "iso";
}

export interface DayOptions {
  /** Put the short weekday in front ("Mon 2026-03-09", "Mon 9 Mar 2026", "Mon, Mar 9, 2026"). */
  weekday?: boolean;
  /** Leave the year out ("03-09", "9 Mar", "Mar 9"): for headers inside a range that already says the year. */
  year?: boolean;
}

const WEEKDAYS = ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"];
const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

const ISO_DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

/** A calendar date (YYYY-MM-DD) as the person reads it. Anything that is not such a date is returned unchanged. */
export function formatDay(ymd: string, style: DateStyle, options: DayOptions = {}): string {
  const m = ISO_DAY.exec(ymd);
  if (!m) return ymd;
  const instant = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  if (Number.isNaN(instant.getTime())) return ymd;
  const weekday = options.weekday ?? false;
  const year = options.year ?? true;
  const wd = WEEKDAYS[instant.getUTCDay()];
  if (style === "iso") {
    const day = year ? ymd : ymd.slice(5);
    return weekday ? `${wd} ${day}` : day;
  }
  const d = instant.getUTCDate();
  const mon = MONTHS[instant.getUTCMonth()];
  const y = instant.getUTCFullYear();
  if (style === "day-month") return `${weekday ? `${wd} ` : ""}${d} ${mon}${year ? ` ${y}` : ""}`;
  return `${weekday ? `${wd}, ` : ""}${mon} ${d}${year ? `, ${y}` : ""}`;
}

/** Two dates as a range ("2026-03-09 – 2026-03-15", "9 Mar – 15 Mar 2026", "Mar 9 – Mar 15, 2026"). */
export function formatDayRange(from: string, to: string, style: DateStyle): string {
  if (from === to) return formatDay(from, style);
  const sameYear = from.slice(0, 4) === to.slice(0, 4);
  return `${formatDay(from, style, { year: style === "iso" || !sameYear })} – ${formatDay(to, style)}`;
}

/**
 * Every ISO date inside a sentence written by the server ("Move "Hills" to 2026-03-11: …") put in the person's style.
 * Sentences are composed once, with ISO dates, and shown to each reader in their own.
 */
export function localiseDates(text: string, style: DateStyle): string {
  if (style === "iso") return text;
  return text.replace(/\b(\d{4}-\d{2}-\d{2})\b/g, (d) => formatDay(d, style));
}
