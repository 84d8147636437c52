/**
 * Talk test (Persinger, Foster et al. 2004, Med Sci Sports Exerc 36:1632–1636): the first stage where speech is no longer
 * comfortable lies near VT1; the first where speaking is no longer possible lies near the respiratory compensation point.
 */
import { z } from "zod";

export const SPEECH = ["comfortable", "not_fully_comfortable", "cannot_speak"] as const;
export type Speech = (typeof SPEECH)[number];

export const talkStageSchema = z.object({
  workload: z.number({ error: "Enter the workload as a number." }).positive("The workload must be above 0."),
  durationS: z
    .number({ error: "Enter the stage duration in seconds." })
    .int()
    .min(30, "A stage lasts at least 30 s.")
    .max(1800, "A stage lasts at most 30 min."),
  hrBpm: z
    .number({ error: "Enter the heart rate in bpm." })
    .int()
    .min(40, "Heart rate must be at least 40 bpm.")
    .max(240, "Heart rate must be at most 240 bpm."),
  speech: z.enum(SPEECH, { error: "Choose how speaking felt." }),
});

export const talkTestSchema = z.object({
  workloadUnit: z.enum(["W", "km/h"], { error: "The workload is power (W) or speed (km/h)." }),
  stages: z.array(talkStageSchema).min(2, "Enter at least two stages.").max(30, "At most 30 stages."),
});

export type TalkTestInput = z.infer<typeof talkTestSchema>;

export interface TalkThreshold {
  stage: number;
  workload: number;
  workloadUnit: "W" | "km/h";
  hrBpm: number;
}

export interface TalkTestResult {
  vt1: TalkThreshold | null;
  vt1Reason: string | null;
  vt2: TalkThreshold | null;
  vt2Reason: string | null;
  warnings: string[];
}

/** A stage needs about three minutes to reach a steady state (common practice). */
export const STEADY_STATE_S = 180;

export function analyzeTalkTest(input: TalkTestInput): TalkTestResult {
  const { stages, workloadUnit } = input;
  const warnings: string[] = [];
  const short = stages.filter((s) => s.durationS < STEADY_STATE_S - 10).length;
  if (short)
    warnings.push(
      `${short} stage(s) were shorter than about 3 minutes: heart rate had not caught up with the workload, so the heart rate at each threshold is probably too low and the workload (speed or power) at each threshold too high.`,
    );
  for (let i = 1; i < stages.length; i++) {
    if (stages[i]!.workload <= stages[i - 1]!.workload) {
      warnings.push(`Stage ${i + 1} is not harder than stage ${i}: talk-test stages should rise steadily.`);
      break;
    }
  }
  const rank = (s: Speech) => SPEECH.indexOf(s);
  for (let i = 1; i < stages.length; i++) {
    if (rank(stages[i]!.speech) < rank(stages[i - 1]!.speech)) {
      warnings.push(`Speech got easier at stage ${i + 1} than at stage ${i}; check the entries.`);
      break;
    }
  }
  const at = (i: number): TalkThreshold => ({
    stage: i + 1,
    workload: stages[i]!.workload,
    workloadUnit,
    hrBpm: stages[i]!.hrBpm,
  });
  const i1 = stages.findIndex((s) => s.speech !== "comfortable");
  const i2 = stages.findIndex((s) => s.speech === "cannot_speak");
  let vt1: TalkThreshold | null = null,
    vt2: TalkThreshold | null = null;
  let vt1Reason: string | null = null,
    vt2Reason: string | null = null;
  if (i1 === -1)
    vt1Reason = "Speech stayed comfortable in every stage: VT1 lies above the last stage. Add harder stages.";
  else if (i1 === 0)
    vt1Reason = "Speech was already not comfortable in the first stage: VT1 lies below it. Start easier.";
  else vt1 = at(i1);
  if (i2 === -1) vt2Reason = "The athlete could still speak in the last stage: VT2 was not reached.";
  else if (i2 === i1 && i1 >= 0) {
    vt2 = at(i2);
    warnings.push(
      "Speech went from comfortable straight to impossible in one stage: use smaller steps to separate VT1 and VT2.",
    );
  } else vt2 = at(i2);
  return { vt1, vt1Reason, vt2, vt2Reason, warnings };
}
