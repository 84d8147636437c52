/**
 * When a reminder is due, from an instant and a person's IANA time zone (Node's Intl time-zone data), so that "07:00 in
 * Oslo" is 06:00 UTC in winter and 05:00 UTC in summer. Pure: the jobs pass the clock in.
 */
import type { DateStyle } from "@/features/platform/lib/date-format";
import { addDays } from "@/features/platform/lib/days";

export interface LocalTime {
  /** The local calendar day, YYYY-MM-DD. */
  date: string;
  /** Minutes since local midnight. */
  minutes: number;
  /** ISO weekday, 1 = Monday … 7 = Sunday. */
  weekday: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();
const WEEKDAY = { Mon: 1, Tue: 2, Wed: 3, Thu: 4, Fri: 5, Sat: 6, Sun: 7 } as const;

export function localTime(instant: Date, timeZone: string): LocalTime {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-GB", {
      timeZone,
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      weekday: "short",
      hourCycle: "h23",
    });
    formatters.set(timeZone, f);
  }
  const p = Object.fromEntries(f.formatToParts(instant).map((x) => [x.type, x.value]));
  return {
    date: `${p.year}-${p.month}-${p.day}`,
    minutes: Number(p.hour) * 60 + Number(p.minute),
    weekday: WEEKDAY[p.weekday as keyof typeof WEEKDAY],
  };
}

export const minutesOf = (hhmm: string) => Number(hhmm.slice(0, 2)) * 60 + Number(hhmm.slice(3, 5));

/**
 * The day whose sessions a reminder covers, once the person's chosen local time has come: the same day ("morning_of") or
 * the next ("evening_before"); null before that time, or when reminders are off.
 */
export function sessionReminderDay(
  now: Date,
  timeZone: string,
  timing: "evening_before" | "morning_of" | "off",
  time: string,
): string | null {
  if (timing === "off") return null;
  const local = localTime(now, timeZone);
  if (local.minutes < minutesOf(time)) return null;
  return timing === "morning_of" ? local.date : addDays(local.date, 1);
}

/**
 * Which retest reminder is due for a retest on `retestDate`: seven days before ("week"), the day before ("day"), or once
 * it is past without a test on or after it ("overdue"); each from the person's reminder time on that local day.
 */
export function retestStage(
  now: Date,
  timeZone: string,
  time: string,
  retestDate: string,
  testedSince: boolean,
): "week" | "day" | "overdue" | null {
  const local = localTime(now, timeZone);
  if (local.date > retestDate) return testedSince ? null : "overdue";
  if (local.minutes < minutesOf(time)) return null;
  if (local.date === addDays(retestDate, -1)) return "day";
  if (local.date >= addDays(retestDate, -7) && local.date < addDays(retestDate, -1)) return "week";
  return null;
}

/** The Monday whose digest is due: on Mondays from 07:00 local time, null otherwise. */
export const DIGEST_TIME = "07:00";
export function digestMonday(now: Date, timeZone: string): string | null {
  const local = localTime(now, timeZone);
  return local.weekday === 1 && local.minutes >= minutesOf(DIGEST_TIME) ? local.date : null;
}

/**
 * A day written out for people in an e-mail, in the reader's date style (platform/lib/date-format.ts): "Tuesday 5 January
 * 2027" (day before month, en-GB), "Tuesday, January 5, 2027" (month before day, en-US) or "Tuesday 2027-01-05" (ISO).
 */
const weekdayName = new Intl.DateTimeFormat("en-GB", { weekday: "long", timeZone: "UTC" });
const longDate = (locale: string) =>
  new Intl.DateTimeFormat(locale, { weekday: "long", day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });
const LONG = { "day-month": longDate("en-GB"), "month-day": longDate("en-US") };
export function dayLabel(date: string, style: DateStyle): string {
  const noon = new Date(`${date}T12:00:00Z`);
  if (style === "iso") return `${weekdayName.format(noon)} ${date}`;
  // en-GB writes "Tuesday 5 January 2027" (some ICU versions put a comma after the weekday: one form everywhere).
  return style === "day-month" ? LONG[style].format(noon).replace(/^(\w+), /, "$1 ") : LONG[style].format(noon);
}
