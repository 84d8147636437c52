/**
 * Repeating sessions by RFC 5545 recurrence rules (RRULE), expanded with the rrule package. Sessions are local calendar
 * days, so rules are expanded as floating dates (no time of day, no zone): a weekly Tuesday stays a Tuesday across a
 * daylight-saving change in the athlete's time zone.
 */
import * as rruleModule from "rrule";
import type { RRule as RRuleType, Weekday } from "rrule";
import { MAX_OCCURRENCES, repeatSchema, type Repeat } from "./repeat";
import { WEEKDAYS } from "./weekdays";

// Bundlers load rrule's ES build; Node's own loader (the bench, scripts) its CommonJS build, whose names sit on "default".
const RRule: typeof RRuleType =
  "RRule" in rruleModule && rruleModule.RRule
    ? rruleModule.RRule
    : (rruleModule as unknown as { default: typeof rruleModule }).default.RRule;

export { MAX_OCCURRENCES, repeatSchema, WEEKDAYS, type Repeat };
const RRULE_DAYS: Weekday[] = [RRule.MO, RRule.TU, RRule.WE, RRule.TH, RRule.FR, RRule.SA, RRule.SU];

function utcDate(iso: string): Date {
  const [y, m, d] = iso.split("-").map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d));
}

export function ruleFor(startDate: string, repeat: Repeat): RRuleType {
  return new RRule({
    freq: RRule.WEEKLY,
    dtstart: utcDate(startDate),
    byweekday: repeat.byWeekday.map((d) => RRULE_DAYS[WEEKDAYS.indexOf(d)]!),
    ...(repeat.until ? { until: new Date(utcDate(repeat.until).getTime() + 86_399_000) } : { count: repeat.count }),
  });
}

/** The RRULE text (without DTSTART), e.g. "FREQ=WEEKLY;BYDAY=TU,TH;COUNT=8". */
export function rruleText(startDate: string, repeat: Repeat): string {
  return ruleFor(startDate, repeat)
    .toString()
    .split("\n")
    .find((l) => l.startsWith("RRULE:"))!
    .slice(6);
}

/** The local dates of the occurrences, from the start date on, at most MAX_OCCURRENCES. */
export function expandDates(startDate: string, repeat: Repeat): string[] {
  const dates = ruleFor(startDate, repeat).all((_, i) => i < MAX_OCCURRENCES);
  return dates.map((d) => d.toISOString().slice(0, 10));
}
