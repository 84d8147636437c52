/**
 * Submaximal estimate of VO2max: VO2 of each steady stage from the ACSM metabolic equations, the heart-rate/VO2 line
 * through the stages, extrapolated to maximal heart rate (measured, or predicted from age). Always reported with its
 * typical error: a standard error of estimate of 10–20 % is typical (common practice; from memory), larger for very trained
 * and very untrained people, whose maximal heart rate and economy differ most from the equations' averages.
 */
import { z } from "zod";
import { fitLine } from "@/features/gas-exchange/lib/breakpoint";
import {
  ACSM_VALID,
  acsmArmVo2,
  acsmCyclingVo2,
  acsmRunningVo2,
  acsmWalkingVo2,
  HR_MAX_FORMULAS,
  kmhToMMin,
  predictedHrMax,
  type HrMaxFormula,
} from "@/features/physiology/lib/equations";

export const submaxSchema = z
  .object({
    modality: z.enum(["cycling", "arm", "running", "walking"], {
      error: "Choose cycling, arm cranking, running or walking.",
    }),
    massKg: z
      .number({ error: "Enter body mass in kg." })
      .gt(20, "Body mass must be above 20 kg.")
      .lt(300, "Body mass must be below 300 kg."),
    age: z.number().int().min(10, "Age must be at least 10.").max(100, "Age must be at most 100.").nullable(),
    measuredHrMaxBpm: z
      .number()
      .int()
      .min(100, "Maximal heart rate must be at least 100 bpm.")
      .max(240, "Maximal heart rate must be at most 240 bpm.")
      .nullable(),
    hrMaxFormula: z.enum(["tanaka", "gellish", "traditional"]).default("tanaka"),
    stages: z
      .array(
        z.object({
          powerW: z.number().positive("Power must be above 0 W.").max(2000).nullable().default(null),
          speedKmh: z.number().positive("Speed must be above 0 km/h.").max(30).nullable().default(null),
          gradePct: z.number().min(0).max(40, "Grade at most 40 %.").default(0),
          hrBpm: z
            .number()
            .int()
            .min(50, "Heart rate must be at least 50 bpm.")
            .max(230, "Heart rate must be at most 230 bpm."),
          /** Heart rate one minute before the end of the stage: steady state when within about 5 bpm of the last. */
          hrBpmMinuteBefore: z.number().int().min(50).max(230).nullable().default(null),
        }),
      )
      .min(2, "Enter at least two submaximal stages.")
      .max(10),
  })
  .refine((v) => v.age !== null || v.measuredHrMaxBpm !== null, {
    path: ["age"],
    message: "Give the age or a measured maximal heart rate.",
  })
  .refine(
    (v) =>
      v.stages.every((s) =>
        v.modality === "cycling" || v.modality === "arm" ? s.powerW !== null : s.speedKmh !== null,
      ),
    {
      path: ["stages"],
      message: "Each stage needs a power (cycling, arm cranking) or a speed (running, walking).",
    },
  );

/** Steady state at the end of a stage: two readings a minute apart within this many bpm (common practice). */
export const STEADY_HR_BPM = 5;

export type SubmaxInput = z.infer<typeof submaxSchema>;

export const TYPICAL_ERROR_FRACTION = 0.15;

export interface SubmaxResult {
  vo2MaxMlKgMin: number | null;
  band: [number, number] | null;
  hrMaxBpm: number;
  hrMaxSource: string;
  stageVo2MlKgMin: number[];
  slope: number | null;
  reason: string | null;
  warnings: string[];
  caveat: string;
}

export const SUBMAX_CAVEAT =
  "A submaximal estimate assumes a straight heart-rate/VO2 line, an average maximal heart rate for the age and average economy. " +
  "Its typical error is about ±15 % (10–20 % is usual); it tends to underestimate very trained people and overestimate untrained ones.";

export function estimateVo2Max(input: SubmaxInput): SubmaxResult {
  const warnings: string[] = [];
  const hrMax = input.measuredHrMaxBpm ?? predictedHrMax(input.age!, input.hrMaxFormula as HrMaxFormula);
  const hrMaxSource = input.measuredHrMaxBpm ? "measured" : HR_MAX_FORMULAS[input.hrMaxFormula as HrMaxFormula].label;
  const valid = ACSM_VALID[input.modality];
  input.stages.forEach((s, i) => {
    const x = input.modality === "cycling" || input.modality === "arm" ? s.powerW! : kmhToMMin(s.speedKmh!);
    if (x < valid.min || x > valid.max) {
      const shown = valid.unit === "W" ? `${Math.round(x)} W` : `${Math.round(x)} m/min (${s.speedKmh} km/h)`;
      const range =
        valid.max === Infinity
          ? `above about ${valid.min} ${valid.unit}`
          : `about ${valid.min}–${valid.max} ${valid.unit}`;
      warnings.push(
        `Stage ${i + 1} (${shown}) lies outside the range where the ACSM ${input.modality === "arm" ? "arm-ergometry" : input.modality} equation holds (${range}): its VO2, and the estimate, are less certain.`,
      );
    }
    if (s.hrBpmMinuteBefore != null && Math.abs(s.hrBpm - s.hrBpmMinuteBefore) > STEADY_HR_BPM) {
      warnings.push(
        `Stage ${i + 1}: heart rate changed by ${Math.abs(s.hrBpm - s.hrBpmMinuteBefore)} bpm over its last minute (more than about ${STEADY_HR_BPM}), so it was not steady; lengthen the stage until it settles.`,
      );
    }
  });
  const vo2s = input.stages.map((s) => {
    if (input.modality === "cycling") return acsmCyclingVo2(s.powerW!, input.massKg);
    if (input.modality === "arm") return acsmArmVo2(s.powerW!, input.massKg);
    const speed = kmhToMMin(s.speedKmh!);
    const grade = s.gradePct / 100;
    return input.modality === "running" ? acsmRunningVo2(speed, grade) : acsmWalkingVo2(speed, grade);
  });
  const hrs = input.stages.map((s) => s.hrBpm);
  const base = {
    hrMaxBpm: Math.round(hrMax),
    hrMaxSource,
    stageVo2MlKgMin: vo2s.map((v) => Math.round(v * 10) / 10),
    caveat: SUBMAX_CAVEAT,
  };
  if (Math.max(...hrs) - Math.min(...hrs) < 10) {
    return {
      ...base,
      vo2MaxMlKgMin: null,
      band: null,
      slope: null,
      warnings,
      reason:
        "The stages' heart rates differ by less than 10 bpm: the line cannot be drawn reliably. Use stages further apart.",
    };
  }
  const line = fitLine(hrs, vo2s);
  if (line.slope <= 0) {
    return {
      ...base,
      vo2MaxMlKgMin: null,
      band: null,
      slope: line.slope,
      warnings,
      reason: "Heart rate did not rise with workload; check the stages.",
    };
  }
  if (hrs.some((h) => h > 0.85 * hrMax))
    warnings.push(
      "A stage reached more than 85 % of maximal heart rate: submaximal protocols usually stop below that.",
    );
  if (hrs.some((h) => h < 0.5 * hrMax))
    warnings.push("A stage stayed below half of maximal heart rate, where the heart-rate/VO2 line is least linear.");
  const estimate = line.intercept + line.slope * hrMax;
  const r1 = (v: number) => Math.round(v * 10) / 10;
  return {
    ...base,
    vo2MaxMlKgMin: r1(estimate),
    band: [r1(estimate * (1 - TYPICAL_ERROR_FRACTION)), r1(estimate * (1 + TYPICAL_ERROR_FRACTION))],
    slope: line.slope,
    reason: null,
    warnings,
  };
}
