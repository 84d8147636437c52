import { z } from "zod";
import { FIRST_YEAR, isCalendarDate, LAST_YEAR } from "./dates";

/** A calendar date as every boundary takes it: "YYYY-MM-DD", a real date, years FIRST_YEAR–LAST_YEAR. */
export const isoDate = z
  .string({ error: "Give a date as YYYY-MM-DD." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Give a date as YYYY-MM-DD.")
  .refine(isCalendarDate, `Give a real calendar date between ${FIRST_YEAR} and ${LAST_YEAR}.`);
