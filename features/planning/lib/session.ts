/**
 * Structured sessions: steps (warm-up, work, recovery, cool-down) with a duration or a distance and a target zone, and
 * nested repeat groups such as 5 × (4 min zone 3, 3 min zone 1). Expansion gives the total duration and minutes per zone.
 */
import { z } from "zod";
import { isSingleLine, SINGLE_LINE_MESSAGE } from "@/features/platform/lib/text";

export const STEP_KINDS = ["warmup", "work", "recovery", "cooldown"] as const;
export const MAX_REPEAT_DEPTH = 3;
export const MAX_SESSION_S = 12 * 3600;
/** The longest distance a session may cover (an ultra-distance day; common practice). */
export const MAX_SESSION_M = 300_000;

export const stepSchema = z
  .object({
    type: z.literal("step"),
    kind: z.enum(STEP_KINDS, { error: "A step is warm-up, work, recovery or cool-down." }),
    durationS: z
      .number()
      .int("Give the duration in whole seconds.")
      .positive("A duration must be above 0.")
      .max(MAX_SESSION_S, "A step lasts at most 12 hours.")
      .optional(),
    distanceM: z
      .number()
      .positive("A distance must be above 0.")
      .max(300_000, "A step covers at most 300 km.")
      .optional(),
    zone: z.number().int().min(1, "Target zone 1, 2 or 3.").max(3, "Target zone 1, 2 or 3."),
    note: z
      .string()
      .max(200, "Keep the note under 200 characters.")
      .refine(isSingleLine, SINGLE_LINE_MESSAGE)
      .optional(),
  })
  .refine((s) => (s.durationS === undefined) !== (s.distanceM === undefined), {
    message: "Give a step either a duration or a distance, not both or neither.",
  });

export type Step = z.infer<typeof stepSchema>;
export interface RepeatGroup {
  type: "repeat";
  times: number;
  steps: Block[];
}
export type Block = Step | RepeatGroup;

// A discriminated union on "type", so that a bad step reports the step's own messages rather than "Invalid input".
export const blockSchema: z.ZodType<Block> = z.lazy(() =>
  z.discriminatedUnion("type", [stepSchema, repeatObjectSchema]),
);
const repeatObjectSchema = z.object({
  type: z.literal("repeat"),
  times: z
    .number()
    .int("Repeat a whole number of times.")
    .min(2, "Repeat at least twice.")
    .max(50, "Repeat at most 50 times."),
  steps: z.array(blockSchema).min(1, "A repeat group needs at least one step.").max(20),
});
export const repeatSchema: z.ZodType<RepeatGroup> = repeatObjectSchema;

function depth(blocks: Block[]): number {
  return blocks.reduce((d, b) => Math.max(d, b.type === "repeat" ? 1 + depth(b.steps) : 0), 0);
}

/**
 * How deep repeat groups nest in a body not yet parsed, looked at before the recursive schema runs (a body nested 800
 * deep must cost nothing). Stops counting past `limit`.
 */
function rawRepeatDepth(value: unknown, limit: number, level = 0): number {
  if (level > limit || !Array.isArray(value)) return level;
  let deepest = level;
  for (const b of value) {
    const steps = b !== null && typeof b === "object" ? (b as { steps?: unknown }).steps : undefined;
    if (Array.isArray(steps)) deepest = Math.max(deepest, rawRepeatDepth(steps, limit, level + 1));
    if (deepest > limit) break;
  }
  return deepest;
}

const parsedStructureSchema = z
  .array(blockSchema)
  .min(1, "A session needs at least one step.")
  .max(40, "A session has at most 40 blocks.")
  .superRefine((blocks, ctx) => {
    if (depth(blocks) > MAX_REPEAT_DEPTH)
      ctx.addIssue({ code: "custom", message: `Repeat groups nest at most ${MAX_REPEAT_DEPTH} deep.` });
    const flat = countSteps(blocks);
    if (flat > 2000) ctx.addIssue({ code: "custom", message: "The session expands to more than 2000 steps." });
    const { seconds, metres } = totals(blocks);
    if (seconds > MAX_SESSION_S)
      ctx.addIssue({
        code: "custom",
        message: `A session lasts at most ${MAX_SESSION_S / 3600} hours; this one adds up to ${Math.round(seconds / 3600)} hours.`,
      });
    if (metres > MAX_SESSION_M)
      ctx.addIssue({
        code: "custom",
        message: `A session covers at most ${MAX_SESSION_M / 1000} km; this one adds up to ${Math.round(metres / 1000)} km.`,
      });
  });

export const structureSchema = z
  .unknown()
  .refine(
    (v) => rawRepeatDepth(v, MAX_REPEAT_DEPTH) <= MAX_REPEAT_DEPTH,
    `Repeat groups nest at most ${MAX_REPEAT_DEPTH} deep.`,
  )
  .pipe(parsedStructureSchema);

/** Seconds of the timed steps and metres of the distance steps, repeats counted. */
function totals(blocks: Block[]): { seconds: number; metres: number } {
  let seconds = 0,
    metres = 0;
  for (const b of blocks) {
    if (b.type === "repeat") {
      const inner = totals(b.steps);
      seconds += b.times * inner.seconds;
      metres += b.times * inner.metres;
    } else {
      seconds += b.durationS ?? 0;
      metres += b.distanceM ?? 0;
    }
  }
  return { seconds, metres };
}

function countSteps(blocks: Block[]): number {
  return blocks.reduce((n, b) => n + (b.type === "repeat" ? b.times * countSteps(b.steps) : 1), 0);
}

export interface FlatStep {
  kind: Step["kind"];
  zone: number;
  durationS: number | null;
  distanceM: number | null;
}

export function flatten(blocks: Block[]): FlatStep[] {
  const out: FlatStep[] = [];
  for (const b of blocks) {
    if (b.type === "repeat") {
      const inner = flatten(b.steps);
      for (let i = 0; i < b.times; i++) out.push(...inner);
    } else out.push({ kind: b.kind, zone: b.zone, durationS: b.durationS ?? null, distanceM: b.distanceM ?? null });
  }
  return out;
}

export interface Expansion {
  totalS: number;
  secondsByZone: [number, number, number];
  minutesByZone: [number, number, number];
  totalDistanceM: number;
  /** Distance steps whose time could not be estimated (no speed for their zone). */
  untimedSteps: number;
  steps: FlatStep[];
  warnings: string[];
}

/** Totals of a structure; distance steps are timed from `speedKmhByZone` when known. */
/** A structure's stored totals: whole seconds, and minutes per zone to a tenth (what templates and sessions keep). */
export function storedTotals(structure: Block[]): { totalS: number; minutesByZone: [number, number, number] } {
  const e = expand(structure);
  return {
    totalS: Math.round(e.totalS),
    minutesByZone: e.minutesByZone.map((m) => Math.round(m * 10) / 10) as [number, number, number],
  };
}

export function expand(blocks: Block[], speedKmhByZone: Partial<Record<1 | 2 | 3, number>> = {}): Expansion {
  const steps = flatten(blocks);
  const secondsByZone: [number, number, number] = [0, 0, 0];
  let totalDistanceM = 0,
    untimed = 0;
  for (const s of steps) {
    let seconds = s.durationS;
    if (seconds === null && s.distanceM !== null) {
      totalDistanceM += s.distanceM;
      const v = speedKmhByZone[s.zone as 1 | 2 | 3];
      seconds = v ? (s.distanceM / 1000 / v) * 3600 : null;
      if (seconds === null) untimed++;
    }
    if (seconds !== null) secondsByZone[s.zone - 1]! += seconds;
  }
  const totalS = secondsByZone[0] + secondsByZone[1] + secondsByZone[2];
  const warnings = untimed
    ? [`${untimed} distance step(s) have no time: the zone set gives no speed for their zone.`]
    : [];
  if (totalS > MAX_SESSION_S) warnings.push("The session lasts more than 12 hours.");
  return {
    totalS,
    secondsByZone,
    minutesByZone: secondsByZone.map((s) => s / 60) as [number, number, number],
    totalDistanceM,
    untimedSteps: untimed,
    steps,
    warnings,
  };
}
