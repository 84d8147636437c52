/** A weekly repeat as the API takes it (weekdays and an end), apart from the rrule package that only the server needs. */
import { isoDate } from "@/features/platform/lib/date-schema";
import { z } from "zod";
import { WEEKDAYS } from "./weekdays";

export const MAX_OCCURRENCES = 104;

export const repeatSchema = z
  .object({
    byWeekday: z
      .array(z.enum(WEEKDAYS, { error: "Weekdays are MO, TU, WE, TH, FR, SA, SU." }))
      .min(1, "Choose at least one weekday.")
      .max(7),
    until: isoDate.optional(),
    count: z
      .number()
      .int()
      .min(1, "Repeat at least once.")
      .max(MAX_OCCURRENCES, `At most ${MAX_OCCURRENCES} occurrences.`)
      .optional(),
  })
  .refine((r) => (r.until === undefined) !== (r.count === undefined), {
    message: "Give either an end date or a number of occurrences.",
  });

export type Repeat = z.infer<typeof repeatSchema>;
