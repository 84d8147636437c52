/** A weekly repeat as the API takes it (weekdays and an end), apart from the rrule package that only the server needs. */
import { z } from "zod";
import { WEEKDAYS } from "./weekdays";

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
