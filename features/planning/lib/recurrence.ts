/**
 * Repeating sessions by RFC 5545 recurrence rules (RRULE), expanded with the rrule package. Sessions are local calendar
 * days, so rules are expanded as floating dates (no time of day, no zone): a weekly Tuesday stays a Tuesday across a
 * daylight-saving change in the athlete's time zone.
 */
import * as rruleModule from "rrule";
import type { RRule as RRuleType, Weekday } from "rrule";
import { z } from "zod";

// Bundlers load rrule's ES build; Node's own loader (the bench, scripts) its CommonJS build, whose names sit on "default".
const RRule: typeof RRuleType = "RRule" in rruleModule && rruleModule.RRule ? rruleModule.RRule : (rruleModule as unknown as { default: typeof rruleModule }).default.RRule;

export const WEEKDAYS = ["MO", "TU", "WE", "TH", "FR", "SA", "SU"] as const;
const RRULE_DAYS: Weekday[] = [RRule.MO, RRule.TU, RRule.WE, RRule.TH, RRule.FR, RRule.SA, RRule.SU];
export const MAX_OCCURRENCES = 104;

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Dates are YYYY-MM-DD.").refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)), "Enter a real calendar date.");

export const repeatSchema = z
  .object({
    byWeekday: z.array(z.enum(WEEKDAYS, { error: "Weekdays are MO, TU, WE, TH, FR, SA, SU." })).min(1, "Choose at least one weekday.").max(7),
    until: isoDate.optional(),
    count: z.number().int().min(1, "Repeat at least once.").max(MAX_OCCURRENCES, `At most ${MAX_OCCURRENCES} occurrences.`).optional(),
  })
  .refine((r) => (r.until === undefined) !== (r.count === undefined), { message: "Give either an end date or a number of occurrences." });

export type Repeat = z.infer<typeof repeatSchema>;

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
  return ruleFor(startDate, repeat).toString().split("\n").find((l) => l.startsWith("RRULE:"))!.slice(6);
}

/** The local dates of the occurrences, from the start date on, at most MAX_OCCURRENCES. */
export function expandDates(startDate: string, repeat: Repeat): string[] {
  const dates = ruleFor(startDate, repeat).all((_, i) => i < MAX_OCCURRENCES);
  return dates.map((d) => d.toISOString().slice(0, 10));
}
