// FIT workout files, decoded with the FIT SDK's own decoder (@garmin/fitsdk, the protocol's reference implementation):
// the steps, repeats, durations and custom targets must read back as the protocol defines them (FIT profile: workout_step
// duration_time in s, duration_distance in m, custom targets with the workout_hr offset of 100 and workout_power offset of
// 1000, speed in m/s).
import { Decoder, Stream } from "@garmin/fitsdk";
import { describe, expect, it } from "vitest";
import { threeZones } from "@/features/zones/lib/zones";
import { encodeWorkout } from "./fit-workout";

function decode(bytes: Uint8Array) {
  const decoder = new Decoder(Stream.fromByteArray(Array.from(bytes)));
  expect(decoder.isFIT()).toBe(true);
  expect(decoder.checkIntegrity()).toBe(true);
  const { messages, errors } = decoder.read();
  expect(errors).toEqual([]);
  return messages as Record<string, Record<string, unknown>[]>;
}

const zones = threeZones({ hrBpm: 150, powerW: 220, speedKmh: 12 }, { hrBpm: 172, powerW: 290, speedKmh: 14.4 });

describe("FIT workout files", () => {
  it("a cycling session: warm-up, 5 × (4 min zone 3, 3 min zone 1), cool-down, with power targets in the athlete's zones", () => {
    const bytes = encodeWorkout({
      title: "5 × 4 min",
      sport: "cycling",
      createdAt: new Date("2027-01-04T06:00:00Z"),
      zones,
      structure: [
        { type: "step", kind: "warmup", durationS: 900, zone: 1 },
        {
          type: "repeat",
          times: 5,
          steps: [
            { type: "step", kind: "work", durationS: 240, zone: 3 },
            { type: "step", kind: "recovery", durationS: 180, zone: 1 },
          ],
        },
        { type: "step", kind: "cooldown", durationS: 600, zone: 1, note: "Easy spin" },
      ],
    });
    const m = decode(bytes);
    expect(m.fileIdMesgs![0]).toMatchObject({ type: "workout" });
    expect(m.workoutMesgs![0]).toMatchObject({ wktName: "5 × 4 min", sport: "cycling", numValidSteps: 5 });
    const steps = m.workoutStepMesgs!;
    expect(steps).toHaveLength(5);
    expect(steps[0]).toMatchObject({
      durationType: "time",
      durationTime: 900,
      intensity: "warmup",
      targetType: "power",
    });
    // Zone 1 (below VT1 = 220 W): 0 W up to 219 W, as watts (offset 1000; the decoder names a raw 1000 by the offset's
    // own name, so the raw field is read here).
    expect(steps[0]).toMatchObject({ customTargetValueLow: 1000, customTargetPowerHigh: 1219 });
    // Zone 3 (from VT2 = 290 W, no upper edge).
    expect(steps[1]).toMatchObject({ durationTime: 240, intensity: "active", customTargetPowerLow: 1290 });
    expect(steps[1]!.customTargetPowerHigh as number).toBeGreaterThan(2000);
    expect(steps[2]).toMatchObject({ durationTime: 180, intensity: "recovery" });
    // The repeat step points back at the group's first step and repeats it five times in all.
    expect(steps[3]).toMatchObject({ durationType: "repeatUntilStepsCmplt", durationStep: 1, repeatSteps: 5 });
    expect(steps[4]).toMatchObject({ wktStepName: "Easy spin", durationTime: 600, intensity: "cooldown" });
  });

  it("a run by distance gets pace targets as speed in m/s; without zones the steps are open", () => {
    const structure = [
      { type: "step" as const, kind: "work" as const, distanceM: 5000, zone: 2 },
      {
        type: "repeat" as const,
        times: 3,
        steps: [
          {
            type: "repeat" as const,
            times: 2,
            steps: [{ type: "step" as const, kind: "work" as const, durationS: 60, zone: 3 }],
          },
          { type: "step" as const, kind: "recovery" as const, durationS: 120, zone: 1 },
        ],
      },
    ];
    const run = decode(
      encodeWorkout({ title: "Tempo", sport: "running", createdAt: new Date(), zones, structure }),
    ).workoutStepMesgs!;
    // Zone 2: 12.0–14.4 km/h = 3.333–4.0 m/s.
    expect(run[0]).toMatchObject({ durationType: "distance", durationDistance: 5000, targetType: "speed" });
    expect(run[0]!.customTargetSpeedLow as number).toBeCloseTo(3.333, 3);
    expect(run[0]!.customTargetSpeedHigh as number).toBeCloseTo(4.0, 3);
    // Nested: the inner repeat goes back to step 1 twice, the outer to step 1 three times.
    expect(run[2]).toMatchObject({ durationType: "repeatUntilStepsCmplt", durationStep: 1, repeatSteps: 2 });
    expect(run[4]).toMatchObject({ durationType: "repeatUntilStepsCmplt", durationStep: 1, repeatSteps: 3 });
    const open = decode(
      encodeWorkout({ title: "Tempo", sport: "running", createdAt: new Date(), zones: null, structure }),
    ).workoutStepMesgs!;
    expect(open[0]).toMatchObject({ targetType: "open" });
  });

  it("heart rate when the sport's first measure is missing (a swim), as bpm with the offset of 100", () => {
    const hrOnly = threeZones({ hrBpm: 140 }, { hrBpm: 165 });
    const steps = decode(
      encodeWorkout({
        title: "Swim",
        sport: "swimming",
        createdAt: new Date(),
        zones: hrOnly,
        structure: [{ type: "step", kind: "work", durationS: 600, zone: 2 }],
      }),
    ).workoutStepMesgs!;
    expect(steps[0]).toMatchObject({
      targetType: "heartRate",
      customTargetHeartRateLow: 240,
      customTargetHeartRateHigh: 264,
    });
  });
});
