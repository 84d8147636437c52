import { versionField } from "@/features/platform/lib/version";
import { z } from "zod";
import { SPORTS } from "@/features/platform/lib/sports";
import { isTimeZone, TIME_ZONE_MESSAGE } from "@/features/platform/lib/time-zones";

const currentYear = new Date().getUTCFullYear();

export const profileSchema = z
  .object({
    birthYear: z
      .number({ error: "Enter the year of birth as a number." })
      .int("Enter a whole year.")
      .min(1900, "Enter a year of birth after 1900.")
      .max(currentYear - 8, `Athletes must be born in ${currentYear - 8} or earlier.`)
      .nullable(),
    sex: z.enum(["female", "male"], { error: "Choose female or male (used by sex-specific formulas)." }).nullable(),
    bodyMassKg: z
      .number({ error: "Enter body mass in kg." })
      .gt(20, "Body mass must be above 20 kg.")
      .lt(300, "Body mass must be below 300 kg.")
      .nullable(),
    restingHrBpm: z
      .number({ error: "Enter resting heart rate in bpm." })
      .int("Enter a whole number of beats per minute.")
      .min(25, "Resting heart rate must be at least 25 bpm.")
      .max(120, "Resting heart rate must be at most 120 bpm.")
      .nullable(),
    maxHrBpm: z
      .number({ error: "Enter maximal heart rate in bpm." })
      .int("Enter a whole number of beats per minute.")
      .min(100, "Maximal heart rate must be at least 100 bpm.")
      .max(240, "Maximal heart rate must be at most 240 bpm.")
      .nullable(),
    sports: z.array(z.enum(SPORTS, { error: "Unknown sport." })).max(SPORTS.length),
    timeZone: z.string().refine(isTimeZone, TIME_ZONE_MESSAGE),
    reminderTiming: z.enum(["evening_before", "morning_of", "off"], { error: "Choose when reminders arrive." }),
    reminderTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, "Enter the reminder time as HH:MM (24-hour clock)."),
    remindSessions: z.boolean(),
    remindRetests: z.boolean(),
    maxHardDays: z
      .number({ error: "Enter the hard days allowed a week as a number." })
      .int("Enter a whole number of days.")
      .min(1, "Allow at least one hard day a week.")
      .max(7, "A week has seven days."),
    hardDaysBackToBack: z.boolean(),
    volumeTolerancePct: z
      .number({ error: "Enter the volume tolerance in %." })
      .int("Enter a whole percentage.")
      .min(5, "The volume tolerance must be at least 5 %.")
      .max(50, "The volume tolerance must be at most 50 %."),
  })
  .refine((p) => p.restingHrBpm == null || p.maxHrBpm == null || p.restingHrBpm < p.maxHrBpm, {
    path: ["maxHrBpm"],
    message: "Maximal heart rate must be above resting heart rate.",
  });

export type ProfileInput = z.infer<typeof profileSchema>;

/** PATCH accepts any subset of the fields; the merged profile must still be valid. */
export const profilePatchSchema = z
  .object({
    birthYear: z.unknown(),
    sex: z.unknown(),
    bodyMassKg: z.unknown(),
    restingHrBpm: z.unknown(),
    maxHrBpm: z.unknown(),
    sports: z.unknown(),
    timeZone: z.unknown(),
    reminderTiming: z.unknown(),
    reminderTime: z.unknown(),
    remindSessions: z.unknown(),
    /** The profile's version as the client read it; an older one answers 409. */
    version: versionField,
    remindRetests: z.unknown(),
    maxHardDays: z.unknown(),
    hardDaysBackToBack: z.unknown(),
    volumeTolerancePct: z.unknown(),
  })
  .partial()
  .strict();
