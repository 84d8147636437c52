import { isoDate } from "@/features/platform/lib/date-schema";
import { versionField } from "@/features/platform/lib/version";
import { z } from "zod";
import { SPORTS } from "@/features/platform/lib/sports";
import { repeatSchema } from "./lib/repeat";
import { structureSchema } from "./lib/session";
import { isPlainText, isSingleLine, PLAIN_TEXT_MESSAGE, SINGLE_LINE_MESSAGE } from "@/features/platform/lib/text";

export { isoDate };

export const templateSchema = z.object({
  squadId: z.string().min(1, "Choose the squad."),
  name: z
    .string()
    .trim()
    .min(2, "Name the template (at least 2 characters).")
    .max(80, "Keep the name under 80 characters.")
    .refine(isSingleLine, SINGLE_LINE_MESSAGE),
  sport: z.enum(SPORTS, { error: "Choose a sport." }),
  description: z
    .string()
    .trim()
    .max(500, "Keep the description under 500 characters.")
    .refine(isPlainText, PLAIN_TEXT_MESSAGE)
    .default(""),
  structure: structureSchema,
});

export const templatePatchSchema = templateSchema.omit({ squadId: true }).partial().extend({ version: versionField });

export const createSessionSchema = z.union(
  [
    z.object({ date: isoDate, templateId: z.string().min(1), repeat: repeatSchema.optional() }).strict(),
    z
      .object({
        date: isoDate,
        title: z.string().trim().min(1, "Give the session a title.").max(80).refine(isSingleLine, SINGLE_LINE_MESSAGE),
        sport: z.enum(SPORTS, { error: "Choose a sport." }),
        kind: z.enum(["training", "retest"]).default("training"),
        structure: structureSchema,
        notes: z.string().max(1000).refine(isPlainText, PLAIN_TEXT_MESSAGE).optional(),
        repeat: repeatSchema.optional(),
      })
      .strict(),
  ],
  { error: "Send {date, templateId} or a full session {date, title, sport, structure}." },
);

export const patchSessionSchema = z
  .object({
    date: isoDate.optional(),
    title: z.string().trim().min(1).max(80).refine(isSingleLine, SINGLE_LINE_MESSAGE).optional(),
    structure: structureSchema.optional(),
    notes: z.string().max(1000).refine(isPlainText, PLAIN_TEXT_MESSAGE).optional(),
    scope: z.enum(["one", "series"]).default("one"),
    /** The session's version as the client read it; an older one answers 409. */
    version: versionField,
  })
  .refine((p) => p.date !== undefined || p.title !== undefined || p.structure !== undefined || p.notes !== undefined, {
    message: "Nothing to change.",
  });

export const rangeQuery = z
  .object({ from: isoDate, to: isoDate })
  .refine((q) => q.from <= q.to, { message: "from must not be after to." })
  .refine((q) => Date.parse(q.to) - Date.parse(q.from) <= 400 * 86_400_000, {
    message: "Ask for at most 400 days at a time.",
  });

export const seasonSchema = z.object({
  name: z.string().trim().min(2, "Name the season.").max(80).refine(isSingleLine, SINGLE_LINE_MESSAGE),
  sport: z.enum(SPORTS, { error: "Choose a sport." }),
  startDate: isoDate,
  events: z
    .array(
      z.object({
        date: isoDate,
        name: z.string().trim().min(1, "Name the event.").max(80).refine(isSingleLine, SINGLE_LINE_MESSAGE),
        priority: z.enum(["A", "B", "C"], { error: "The priority is A, B or C." }).default("A"),
        durationMin: z
          .number({ error: "Give the race's expected length in minutes." })
          .int("Give the race's length in whole minutes.")
          .min(5, "A race lasts at least 5 minutes.")
          .max(1440, "A race lasts at most 24 hours.")
          .optional(),
      }),
    )
    .min(1, "Give at least one event.")
    .max(8),
  weeklyHours: z
    .number({ error: "Give weekly hours." })
    .positive("Weekly hours must be above 0.")
    .max(40, "At most 40 hours a week."),
  level: z.enum(["trained", "beginner"]).default("trained"),
  loadingWeeks: z.union([z.literal(2), z.literal(3)]).default(3),
  retestEveryWeeks: z
    .number()
    .int()
    .min(12, "Retests come every 12 to 16 weeks.")
    .max(16, "Retests come every 12 to 16 weeks.")
    .default(12),
});

/** A coach's edit of one generated season week; the retest flag adds or removes that week's retest session. */
export const seasonWeekPatchSchema = z
  .object({
    block: z
      .enum(["general_preparation", "specific_preparation", "pre_competition", "taper", "competition", "transition"], {
        error: "Choose a block.",
      })
      .optional(),
    role: z
      .enum(["loading", "unloading", "taper", "event", "recovery"], { error: "Choose the week's role." })
      .optional(),
    volumeHours: z
      .number({ error: "Give the week's volume in hours." })
      .min(0, "Volume cannot be negative.")
      .max(40, "At most 40 hours a week.")
      .optional(),
    budget: z
      .enum(["polarised", "polarised_sessions", "pyramidal", "beginner", "recovery"], {
        error: "Choose an intensity budget.",
      })
      .optional(),
    retest: z.boolean().optional(),
    /** The season's version as the client read it; an older one answers 409. */
    version: versionField,
  })
  .strict()
  .refine((p) => Object.keys(p).filter((k) => k !== "version").length > 0, { message: "Nothing to change." });

const athleteIds = z
  .array(z.string().min(1), { error: "Choose the athletes." })
  .min(1, "Choose at least one athlete.")
  .max(100, "Plan for at most 100 athletes at once.")
  .refine((ids) => new Set(ids).size === ids.length, "An athlete is listed twice.");
const monday = isoDate.refine((d) => new Date(`${d}T00:00:00Z`).getUTCDay() === 1, "Give the Monday of the week.");
const targetWeeks = z
  .array(monday, { error: "Choose the weeks." })
  .min(1, "Choose at least one week.")
  .max(26, "Copy to at most 26 weeks at once.")
  .refine((w) => new Set(w).size === w.length, "A week is listed twice.");

/**
 * One action for several athletes of a squad: a template on one day, or one athlete's week copied into later weeks. With
 * `preview` nothing is written and each athlete's week is answered as it would be after the action.
 */
export const groupPlanSchema = z.discriminatedUnion(
  "mode",
  [
    z
      .object({
        mode: z.literal("template"),
        templateId: z.string().min(1, "Choose a template."),
        date: isoDate,
        athleteIds,
        preview: z.boolean().default(false),
      })
      .strict(),
    z
      .object({
        mode: z.literal("week"),
        sourceAthleteId: z.string().min(1, "Choose whose week to copy."),
        sourceWeek: monday,
        targetWeeks,
        athleteIds,
        preview: z.boolean().default(false),
      })
      .strict(),
  ],
  {
    error:
      'Send mode "template" ({templateId, date, athleteIds}) or "week" ({sourceAthleteId, sourceWeek, targetWeeks, athleteIds}).',
  },
);

/** Copy an athlete's week into later weeks of their own plan. */
export const copyWeekSchema = z.object({ targetWeeks, preview: z.boolean().default(false) }).strict();
