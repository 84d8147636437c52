/**
 * A planned session as a FIT workout file (the open FIT protocol's `workout` file: file_id, workout, workout_step
 * messages), encoded with the FIT SDK's own encoder so that a watch or a head unit can load it. Each step keeps its
 * duration (time or distance) and gets its zone's range in the athlete's own numbers as a custom target, in the measure
 * the sport trains with first (zones/lib/format.ts): pace as speed for runners, walkers and skiers, power for cyclists and
 * rowers, heart rate otherwise and wherever the first measure is missing. Repeat groups become the protocol's "repeat until
 * steps complete" steps, which point back at the group's first step (nested groups too).
 *
 * Raw values as the FIT profile defines them: time in ms (scale 1000), distance in cm (scale 100), speed in mm/s (scale
 * 1000), heart rate as bpm + 100 and power as W + 1000 (the `workout_hr` and `workout_power` offsets; values below them
 * would mean % of maximum heart rate or of threshold power).
 */
import { Encoder, Profile, type Mesg } from "@garmin/fitsdk";
import type { Block } from "@/features/planning/lib/session";
import { measureOrder } from "@/features/zones/lib/format";
import type { Measure, Zone } from "@/features/zones/lib/zones";

const MESG = {
  fileId: Profile.MesgNum.FILE_ID!,
  workout: Profile.MesgNum.WORKOUT!,
  workoutStep: Profile.MesgNum.WORKOUT_STEP!,
};

/** Our sports in the protocol's sport list (triathlon has no single sport there: generic). */
const FIT_SPORT: Record<string, string> = {
  running: "running",
  cycling: "cycling",
  rowing: "rowing",
  swimming: "swimming",
  walking: "walking",
  cross_country_skiing: "crossCountrySkiing",
  triathlon: "generic",
};

const INTENSITY: Record<string, string> = {
  warmup: "warmup",
  work: "active",
  recovery: "recovery",
  cooldown: "cooldown",
};

const KIND_NAME: Record<string, string> = {
  warmup: "Warm-up",
  work: "Work",
  recovery: "Recovery",
  cooldown: "Cool-down",
};

/**
 * A zone without an upper edge (zone 3) needs one in a custom range: a value no athlete reaches (ours): 240 bpm, 2500 W,
 * 12 m/s (a 1:23 /km pace). A zone without a lower edge (zone 1) starts at 0.
 */
const OPEN_TOP: Record<Measure, number> = { hrBpm: 240, powerW: 2500, speedKmh: 12 * 3.6 };

export interface WorkoutTarget {
  measure: Measure;
  low: number;
  high: number;
}

/** The custom target of a step in zone `zone` (of the set's three zones, as today and the reminders read them): the first
 * measure of the sport's order that the zone carries. */
export function stepTarget(zones: Zone[] | null, zone: number, sport: string): WorkoutTarget | null {
  const z = zones?.[zone - 1];
  if (!z) return null;
  for (const m of measureOrder(sport)) {
    const r = z.ranges[m];
    if (!r) continue;
    return { measure: m, low: r.min ?? 0, high: r.max ?? OPEN_TOP[m] };
  }
  return null;
}

/** Heart rate and power as the protocol's custom targets: the value plus its offset (workout_hr, workout_power). */
const OFFSET_TARGET = {
  hrBpm: { targetType: "heartRate", offset: 100 },
  powerW: { targetType: "power", offset: 1000 },
} as const;

function targetFields(t: WorkoutTarget | null): Record<string, unknown> {
  if (!t) return { targetType: "open", targetValue: 0 };
  if (t.measure === "speedKmh")
    return {
      targetType: "speed",
      targetValue: 0,
      customTargetValueLow: Math.round((t.low / 3.6) * 1000),
      customTargetValueHigh: Math.round((t.high / 3.6) * 1000),
    };
  // A zone holds its lower edge and stops below the next zone's (zones.ts `zoneOf`): the high end is one step below it.
  const { targetType, offset } = OFFSET_TARGET[t.measure];
  return {
    targetType,
    targetValue: 0,
    customTargetValueLow: Math.round(t.low) + offset,
    customTargetValueHigh: Math.max(Math.round(t.low), Math.round(t.high) - 1) + offset,
  };
}

/** At most this many characters of a name: watches show short names (common practice for the protocol's strings). */
const NAME_MAX = 40;
const short = (s: string) => (s.length > NAME_MAX ? `${s.slice(0, NAME_MAX - 1)}…` : s);

export interface WorkoutInput {
  title: string;
  sport: string;
  structure: Block[];
  /** The zones in force for the session (zonesForSession), or null: steps then have no target. */
  zones: Zone[] | null;
  createdAt: Date;
}

/** The workout's steps as FIT workout_step messages, in order (message_index = position). */
export function workoutSteps(input: Pick<WorkoutInput, "structure" | "zones" | "sport">): Record<string, unknown>[] {
  const steps: Record<string, unknown>[] = [];
  const walk = (blocks: Block[]) => {
    for (const b of blocks) {
      if (b.type === "repeat") {
        const first = steps.length;
        walk(b.steps);
        steps.push({
          messageIndex: steps.length,
          durationType: "repeatUntilStepsCmplt",
          durationValue: first,
          targetValue: b.times,
        });
        continue;
      }
      steps.push({
        messageIndex: steps.length,
        wktStepName: short(b.note?.trim() || `${KIND_NAME[b.kind]} · zone ${b.zone}`),
        ...(b.durationS !== undefined
          ? { durationType: "time", durationValue: Math.round(b.durationS * 1000) }
          : { durationType: "distance", durationValue: Math.round(b.distanceM! * 100) }),
        ...targetFields(stepTarget(input.zones, b.zone, input.sport)),
        intensity: INTENSITY[b.kind],
      });
    }
  };
  walk(input.structure);
  return steps;
}

export function encodeWorkout(input: WorkoutInput): Uint8Array {
  const encoder = new Encoder();
  const put = (num: number, m: Record<string, unknown>) => encoder.onMesg(num, m as unknown as Mesg);
  put(MESG.fileId, {
    type: "workout",
    manufacturer: "development",
    product: 1,
    timeCreated: input.createdAt,
    serialNumber: 1,
  });
  const steps = workoutSteps(input);
  put(MESG.workout, {
    wktName: short(input.title),
    sport: FIT_SPORT[input.sport] ?? "generic",
    numValidSteps: steps.length,
  });
  for (const s of steps) put(MESG.workoutStep, s);
  return encoder.close();
}
