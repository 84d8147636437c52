import { z } from "zod";
import { SPORTS } from "@/features/platform/lib/sports";
import { isoDate } from "@/features/planning/schemas";
import { isPlainText, isSingleLine, PLAIN_TEXT_MESSAGE, SINGLE_LINE_MESSAGE } from "@/features/platform/lib/text";

export const LOG_STATUSES = ["done", "partial", "skipped"] as const;
export const LOG_STATUS_LABELS: Record<(typeof LOG_STATUSES)[number], string> = {
  done: "Done",
  partial: "Partly done",
  skipped: "Skipped",
};

const fields = {
  status: z.enum(LOG_STATUSES, { error: "Choose done, partly done or skipped." }),
  durationMin: z
    .number({ error: "Give the duration in minutes." })
    .positive("The duration must be above 0 minutes.")
    .max(1440, "A session lasts at most 24 hours (1440 min).")
    .nullable()
    .optional(),
  distanceKm: z
    .number({ error: "Give the distance in km." })
    .min(0, "The distance cannot be negative.")
    .max(1000, "A session covers at most 1000 km.")
    .nullable()
    .optional(),
  rpe: z
    .number({ error: "Rate the effort from 0 to 10." })
    .min(0, "RPE runs from 0 to 10.")
    .max(10, "RPE runs from 0 to 10.")
    .multipleOf(0.5, "Rate the effort in whole or half points.")
    .nullable()
    .optional(),
  notes: z
    .string()
    .trim()
    .max(2000, "Keep the notes under 2000 characters.")
    .refine(isPlainText, PLAIN_TEXT_MESSAGE)
    .optional(),
  skipReason: z
    .string()
    .trim()
    .max(500, "Keep the reason under 500 characters.")
    .refine(isPlainText, PLAIN_TEXT_MESSAGE)
    .nullable()
    .optional(),
};

type LogFields = { status: string; durationMin?: number | null; rpe?: number | null; skipReason?: string | null };

function requireForStatus(v: LogFields, ctx: z.RefinementCtx) {
  if (v.status === "skipped") {
    if (!v.skipReason)
      ctx.addIssue({
        code: "custom",
        path: ["skipReason"],
        message: "Say why the session was skipped (a few words are enough).",
      });
  } else {
    if (v.durationMin == null)
      ctx.addIssue({ code: "custom", path: ["durationMin"], message: "Give how many minutes you trained." });
    if (v.rpe == null)
      ctx.addIssue({ code: "custom", path: ["rpe"], message: "Rate the whole session from 0 (rest) to 10 (maximal)." });
  }
}

export const logSchema = z.object(fields).strict().superRefine(requireForStatus);

export const unplannedLogSchema = z
  .object({
    ...fields,
    status: z.enum(["done", "partial"], { error: "An unplanned session is done or partly done." }),
    date: isoDate,
    sport: z.enum(SPORTS, { error: "Choose a sport." }),
    title: z
      .string()
      .trim()
      .min(1, "Give the session a title.")
      .max(80, "Keep the title under 80 characters.")
      .refine(isSingleLine, SINGLE_LINE_MESSAGE),
    clientKey: z.string().uuid("clientKey must be a UUID chosen by the client.").optional(),
  })
  .strict()
  .superRefine(requireForStatus);

export const patchLogSchema = z.object(fields).partial().strict();

export const loadQuerySchema = z
  .object({ from: isoDate, to: isoDate })
  .refine((q) => q.from <= q.to, { message: "from must not be after to." })
  .refine((q) => (Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 <= 400, {
    message: "Ask for at most 400 days at a time.",
  });
