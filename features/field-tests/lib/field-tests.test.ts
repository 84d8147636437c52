import { describe, expect, it } from "vitest";
import { analyzeTalkTest, talkTestSchema } from "./talk-test";
import { estimateVo2Max, submaxSchema } from "./submax";

describe("talk test (Persinger, Foster et al. 2004)", () => {
  const stages = (speech: string[], durationS = 180) =>
    talkTestSchema.parse({
      workloadUnit: "W",
      stages: speech.map((s, i) => ({ workload: 100 + 25 * i, durationS, hrBpm: 110 + 10 * i, speech: s })),
    });

  it("VT1 at the first stage not comfortable, VT2 at the first where speaking is impossible", () => {
    const r = analyzeTalkTest(
      stages(["comfortable", "comfortable", "not_fully_comfortable", "not_fully_comfortable", "cannot_speak"]),
    );
    expect(r.vt1).toMatchObject({ stage: 3, workload: 150, hrBpm: 130 });
    expect(r.vt2).toMatchObject({ stage: 5, workload: 200, hrBpm: 150 });
    expect(r.warnings).toEqual([]);
  });

  it("warns about stages shorter than about three minutes (steady state, common practice)", () => {
    const r = analyzeTalkTest(stages(["comfortable", "not_fully_comfortable", "cannot_speak"], 120));
    expect(r.warnings.join(" ")).toMatch(/shorter than about 3 minutes/);
  });

  it("gives null with a reason when a threshold was not reached", () => {
    const r = analyzeTalkTest(stages(["comfortable", "comfortable", "not_fully_comfortable"]));
    expect(r.vt2).toBeNull();
    expect(r.vt2Reason).toMatch(/not reached/);
    const none = analyzeTalkTest(stages(["comfortable", "comfortable"]));
    expect(none.vt1).toBeNull();
    expect(none.vt1Reason).toMatch(/above the last stage/);
  });

  it("rejects a table with one stage or impossible values with clear messages", () => {
    const r = talkTestSchema.safeParse({
      workloadUnit: "W",
      stages: [{ workload: -5, durationS: 10, hrBpm: 300, speech: "maybe" }],
    });
    expect(r.success).toBe(false);
    const messages = r.error!.issues.map((i) => i.message).join(" | ");
    expect(messages).toMatch(/at least two stages/);
    expect(messages).toMatch(/above 0/);
  });
});

describe("submaximal VO2max estimate", () => {
  it("extrapolates the heart-rate/VO2 line of ACSM cycling stages to an age-predicted maximum", () => {
    // 70 kg; 50, 100, 150 W → ACSM leg cycling 14.87, 22.74, 30.61 mL/kg/min; HR 100, 120, 140 bpm (points exactly on a line).
    // Line: VO2 = −24.47 + 0.39343·HR; HRmax (Tanaka 2001, age 40) = 180 → 46.34 mL/kg/min (hand calculation).
    const input = submaxSchema.parse({
      modality: "cycling",
      massKg: 70,
      age: 40,
      measuredHrMaxBpm: null,
      stages: [
        { powerW: 50, hrBpm: 100 },
        { powerW: 100, hrBpm: 120 },
        { powerW: 150, hrBpm: 140 },
      ],
    });
    const r = estimateVo2Max(input);
    expect(r.hrMaxBpm).toBe(180);
    expect(r.vo2MaxMlKgMin).toBeCloseTo(46.3, 1);
    expect(r.band![0]).toBeLessThan(r.vo2MaxMlKgMin!);
    expect(r.band![1]).toBeGreaterThan(r.vo2MaxMlKgMin!);
    expect(r.caveat).toMatch(/very trained/);
  });

  it("uses a measured maximum over the age prediction, and refuses flat heart rates", () => {
    const r = estimateVo2Max(
      submaxSchema.parse({
        modality: "running",
        massKg: 60,
        age: 30,
        measuredHrMaxBpm: 195,
        stages: [
          { speedKmh: 8, hrBpm: 130 },
          { speedKmh: 10, hrBpm: 150 },
        ],
      }),
    );
    expect(r.hrMaxSource).toBe("measured");
    expect(r.hrMaxBpm).toBe(195);
    const flat = estimateVo2Max(
      submaxSchema.parse({
        modality: "cycling",
        massKg: 60,
        age: 30,
        measuredHrMaxBpm: null,
        stages: [
          { powerW: 100, hrBpm: 130 },
          { powerW: 120, hrBpm: 133 },
        ],
      }),
    );
    expect(flat.vo2MaxMlKgMin).toBeNull();
    expect(flat.reason).toMatch(/less than 10 bpm/);
  });

  it("needs an age or a measured maximum", () => {
    const r = submaxSchema.safeParse({
      modality: "cycling",
      massKg: 60,
      age: null,
      measuredHrMaxBpm: null,
      stages: [
        { powerW: 100, hrBpm: 130 },
        { powerW: 150, hrBpm: 150 },
      ],
    });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.message).toMatch(/age or a measured/);
  });
});

describe("submaximal estimate: where the equations hold, and steady heart rate", () => {
  const base = { massKg: 70, age: 40, measuredHrMaxBpm: null, hrMaxFormula: "tanaka" as const };
  it("warns for a walking stage faster than 100 m/min and a cycling stage above 200 W (ACSM validity ranges)", () => {
    const walk = estimateVo2Max({
      ...base,
      modality: "walking",
      stages: [
        { powerW: null, speedKmh: 4, gradePct: 0, hrBpm: 100, hrBpmMinuteBefore: null },
        { powerW: null, speedKmh: 7, gradePct: 0, hrBpm: 125, hrBpmMinuteBefore: null },
      ],
    });
    expect(walk.warnings.join(" ")).toMatch(
      /Stage 2 \(117 m\/min \(7 km\/h\)\) lies outside the range where the ACSM walking equation holds \(about 50–100 m\/min\)/,
    );
    const ride = estimateVo2Max({
      ...base,
      modality: "cycling",
      stages: [
        { powerW: 100, speedKmh: null, gradePct: 0, hrBpm: 110, hrBpmMinuteBefore: null },
        { powerW: 250, speedKmh: null, gradePct: 0, hrBpm: 150, hrBpmMinuteBefore: null },
      ],
    });
    expect(ride.warnings.join(" ")).toMatch(/Stage 2 \(250 W\).*about 50–200 W/);
    const run = estimateVo2Max({
      ...base,
      modality: "running",
      stages: [
        { powerW: null, speedKmh: 6, gradePct: 0, hrBpm: 120, hrBpmMinuteBefore: null },
        { powerW: null, speedKmh: 10, gradePct: 0, hrBpm: 150, hrBpmMinuteBefore: null },
      ],
    });
    expect(run.warnings.join(" ")).toMatch(/Stage 1 \(100 m\/min .*above about 134 m\/min/);
  });
  it("warns when heart rate changed by more than about 5 bpm over a stage's last minute", () => {
    const r = estimateVo2Max({
      ...base,
      modality: "cycling",
      stages: [
        { powerW: 75, speedKmh: null, gradePct: 0, hrBpm: 110, hrBpmMinuteBefore: 108 },
        { powerW: 150, speedKmh: null, gradePct: 0, hrBpm: 140, hrBpmMinuteBefore: 131 },
      ],
    });
    expect(r.warnings.join(" ")).toMatch(/Stage 2: heart rate changed by 9 bpm/);
    expect(r.warnings.join(" ")).not.toMatch(/Stage 1: heart rate changed/);
  });
  it("arm cranking uses the ACSM arm-ergometry equation: 60 W at 70 kg → 3 × 367.2 / 70 + 3.5 = 19.2 mL/kg/min (hand calculation)", () => {
    const r = estimateVo2Max({
      ...base,
      modality: "arm",
      stages: [
        { powerW: 30, speedKmh: null, gradePct: 0, hrBpm: 100, hrBpmMinuteBefore: null },
        { powerW: 60, speedKmh: null, gradePct: 0, hrBpm: 125, hrBpmMinuteBefore: null },
      ],
    });
    expect(r.stageVo2MlKgMin[1]).toBeCloseTo(19.2, 1);
  });
});
