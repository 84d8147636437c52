import { isoDate } from "@/features/platform/lib/date-schema";
import { z } from "zod";
import { SPORTS } from "@/features/platform/lib/sports";
import { submaxSchema } from "@/features/field-tests/lib/submax";
import { talkTestSchema } from "@/features/field-tests/lib/talk-test";
import { CHANNELS, UNIT_CHOICES } from "@/features/gas-exchange/lib/csv";
import { isPlainText, isSingleLine, PLAIN_TEXT_MESSAGE, SINGLE_LINE_MESSAGE } from "@/features/platform/lib/text";
import { SCREENING_QUESTIONS, type ScreeningQuestionId } from "./lib/readiness";

export { SCREENING_QUESTIONS, type ScreeningQuestionId } from "./lib/readiness";

export const screeningSchema = z.object({
  answers: z.object(
    Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, z.boolean({ error: "Answer yes or no." })])) as Record<
      ScreeningQuestionId,
      z.ZodBoolean
    >,
    { error: "Answer every question." },
  ),
  notes: z
    .string()
    .trim()
    .max(1000, "Keep the notes under 1000 characters.")
    .refine(isPlainText, PLAIN_TEXT_MESSAGE)
    .optional(),
});

/** A clearance as a coach records it: who cleared, their role as they typed it, the date, a note. */
export const clearanceSchema = z
  .object({
    clearedBy: z
      .string()
      .trim()
      .min(2, "Name who gave the clearance.")
      .max(120, "Keep the name under 120 characters.")
      .refine(isSingleLine, SINGLE_LINE_MESSAGE),
    role: z
      .string()
      .trim()
      .min(2, "Give their role (for example: sports physician, cardiologist, GP).")
      .max(120, "Keep the role under 120 characters.")
      .refine(isSingleLine, SINGLE_LINE_MESSAGE),
    clearedOn: isoDate,
    note: z
      .string()
      .trim()
      .max(1000, "Keep the note under 1000 characters.")
      .refine(isPlainText, PLAIN_TEXT_MESSAGE)
      .optional(),
  })
  .strict();

/** Signs for stopping a test (our wording of the usual indications, after the ACSM Guidelines' list; from memory). */
export const STOP_SIGNS = [
  { id: "chest_pain", text: "Chest pain, pressure or angina-like discomfort" },
  {
    id: "blood_pressure",
    text: "Blood pressure falls as work rises, or climbs very high (systolic above 250 or diastolic above 115 mmHg)",
  },
  { id: "heart_rate", text: "Heart rate fails to rise with the workload, or the rhythm becomes irregular" },
  { id: "poor_perfusion", text: "Signs of poor perfusion: pallor, bluish lips or skin, cold and clammy skin" },
  { id: "confusion", text: "Confusion, dizziness, unsteadiness or sudden silence" },
  { id: "severe_fatigue", text: "Severe fatigue or breathlessness out of proportion to the work" },
  { id: "equipment", text: "Equipment failure" },
  { id: "request", text: "The athlete asks to stop" },
] as const;

export const STOP_SIGN_IDS = STOP_SIGNS.map((s) => s.id) as [string, ...string[]];

export const testMetaSchema = z
  .object({
    sport: z.enum(SPORTS, { error: "Choose the sport of the test." }),
    protocol: z
      .string()
      .trim()
      .min(2, "Describe the protocol (for example: ramp 25 W/min).")
      .max(200, "Keep the protocol under 200 characters.")
      .refine(isSingleLine, SINGLE_LINE_MESSAGE),
    date: isoDate,
    endedBy: z.enum(["exhaustion", "plan", "stop_sign"], { error: "Say how the test ended." }),
    stopSign: z.enum(STOP_SIGN_IDS, { error: "Choose which stop sign ended the test." }).nullable().optional(),
  })
  .refine((m) => m.endedBy !== "stop_sign" || !!m.stopSign, {
    path: ["stopSign"],
    message: "Choose which stop sign ended the test.",
  });

const thresholdEntry = z
  .object({
    hrBpm: z
      .number()
      .int()
      .min(60, "Heart rate must be at least 60 bpm.")
      .max(230, "Heart rate must be at most 230 bpm.")
      .nullable()
      .optional(),
    powerW: z
      .number()
      .positive("Power must be above 0 W.")
      .max(2500, "Power must be at most 2500 W.")
      .nullable()
      .optional(),
    speedKmh: z
      .number()
      .positive("Speed must be above 0 km/h.")
      .max(45, "Speed must be at most 45 km/h.")
      .nullable()
      .optional(),
  })
  .refine((t) => t.hrBpm != null || t.powerW != null || t.speedKmh != null, {
    message: "Give at least a heart rate, a power or a speed.",
  });

export const jsonTestSchema = z.discriminatedUnion(
  "kind",
  [
    z.object({
      kind: z.literal("talk"),
      meta: testMetaSchema,
      talk: talkTestSchema,
      fiveZones: z.boolean().optional(),
    }),
    z.object({ kind: z.literal("submax"), meta: testMetaSchema, submax: submaxSchema }),
    z.object({
      kind: z.literal("manual"),
      meta: testMetaSchema,
      vt1: thresholdEntry,
      vt2: thresholdEntry,
      fiveZones: z.boolean().optional(),
    }),
  ],
  { error: "The test kind must be talk, submax or manual (gas-exchange tests are uploaded as a file)." },
);

export type JsonTestInput = z.infer<typeof jsonTestSchema>;

export const mappingSchema = z
  .partialRecord(z.enum(CHANNELS), z.string().min(1).max(200))
  .refine((m) => Object.keys(m).length <= CHANNELS.length, "Too many mapped columns.");

export const unitsSchema = z.object(
  {
    time: z.enum(UNIT_CHOICES.time, { error: "Time is in s or min." }).optional(),
    vo2: z.enum(UNIT_CHOICES.vo2, { error: "VO2 is in mL/min, L/min or mL/kg/min." }).optional(),
    speed: z.enum(UNIT_CHOICES.speed, { error: "Speed is in km/h, mph or m/s." }).optional(),
  },
  { error: 'Units must be an object such as {"speed": "mph"}.' },
);

export const segmentSchema = z
  .object(
    {
      fromS: z
        .number()
        .min(0, "The segment starts at 0 s or later.")
        .max(6 * 3600)
        .nullable()
        .optional(),
      toS: z
        .number()
        .min(0)
        .max(6 * 3600, "The segment ends within six hours.")
        .nullable()
        .optional(),
    },
    { error: "The test segment must be {fromS, toS} in seconds." },
  )
  .refine((s) => s.fromS == null || s.toS == null || s.toS > s.fromS + 60, {
    message: "The test segment must end at least a minute after it starts.",
    path: ["toS"],
  });

export const uploadFieldsSchema = testMetaSchema.and(
  z.object({
    mapping: mappingSchema.optional(),
    bodyMassKg: z
      .number()
      .gt(20, "Body mass must be above 20 kg.")
      .lt(300, "Body mass must be below 300 kg.")
      .nullable()
      .optional(),
    fiveZones: z.boolean().optional(),
    units: unitsSchema.optional(),
    segment: segmentSchema.optional(),
    sheet: z.string().trim().min(1).max(100, "A sheet name has at most 100 characters.").nullable().optional(),
  }),
);

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

const adjustedPoint = z.union([
  z.object({
    timeS: z
      .number()
      .min(0, "Time must be 0 s or later.")
      .max(6 * 3600),
  }),
  thresholdEntry,
]);

export const thresholdPatchSchema = z.object({
  vt1: adjustedPoint.nullable(),
  vt2: adjustedPoint.nullable(),
  fiveZones: z.boolean().optional(),
});

export type ThresholdPatch = z.infer<typeof thresholdPatchSchema>;
