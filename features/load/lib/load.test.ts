import { describe, expect, it } from "vitest";
import {
  acwrEwmaSeries,
  acwrFlag,
  acwrRolling,
  banisterTrimp,
  edwardsTrimp,
  edwardsTrimpFromBands,
  monotonyAndStrain,
  sessionRpeLoad,
  timeInZone,
  toOneHz,
} from "./load";

describe("training load", () => {
  it("session-RPE load: 60 min at RPE 5 → 300 AU (Foster et al. 2001)", () => {
    expect(sessionRpeLoad(5, 60)).toBe(300);
  });

  it("Banister TRIMP: 60 min, rest 60, max 190, average 150, male → about 100 (Banister 1991)", () => {
    expect(banisterTrimp({ minutes: 60, hrAvgBpm: 150, hrRestBpm: 60, hrMaxBpm: 190, sex: "male" })).toBeCloseTo(
      100.4,
      0,
    );
    // Female weighting 0.86·e^(1.67x): 60 × 0.6923 × 0.86 × e^(1.1562) = 113.5 (hand calculation).
    expect(banisterTrimp({ minutes: 60, hrAvgBpm: 150, hrRestBpm: 60, hrMaxBpm: 190, sex: "female" })).toBeCloseTo(
      113.5,
      0,
    );
  });

  it("Edwards TRIMP weights 50–100 % HRmax bands 1 to 5 (Edwards 1993)", () => {
    expect(edwardsTrimpFromBands([10, 20, 30, 0, 5])).toBe(10 + 40 + 90 + 25);
    // 10 min at 75 % (weight 3) and 10 min at 95 % (weight 5) of 200 bpm → 80.
    const stream = [...Array(600).fill(150), ...Array(600).fill(190), ...Array(60).fill(null)];
    expect(edwardsTrimp(stream, 200)).toBeCloseTo(80, 6);
  });

  it("monotony = mean ÷ SD and strain = weekly load × monotony (Foster et al. 2001)", () => {
    const r = monotonyAndStrain([300, 0, 300, 0, 300, 0, 300]);
    // mean 171.43, population SD 171.43·√(3/4) → monotony 1.1547 (hand calculation).
    expect(r.weeklyLoad).toBe(1200);
    expect(r.monotony).toBeCloseTo(1.1547, 3);
    expect(r.strain).toBeCloseTo(1385.6, 0);
    expect(monotonyAndStrain([100, 100, 100, 100, 100, 100, 100]).monotony).toBeNull();
  });

  it("rolling ACWR: steady training gives 1.0, a doubled last week gives 1.6 (Hulin et al. 2016 definition)", () => {
    expect(acwrRolling(Array(28).fill(50))).toBeCloseTo(1, 9);
    // Last 7 days 100/day: acute 700; 28-day total 2100 + 700 = 2800 → weekly 700... chronic weekly = (21·50 + 7·100)/4 = 437.5 → 1.6
    expect(acwrRolling([...Array(21).fill(50), ...Array(7).fill(100)])).toBeCloseTo(1.6, 9);
    expect(acwrRolling(Array(10).fill(50))).toBeNull();
    expect(acwrFlag(1.6)).toBe("high");
    expect(acwrFlag(1.0)).toBeNull();
    expect(acwrFlag(0.5)).toBe("low");
  });

  it("EWMA ACWR uses λ = 2/(N+1) (Williams et al. 2017): steady load stays at 1", () => {
    const s = acwrEwmaSeries(Array(40).fill(60));
    expect(s[39]!.ratio).toBeCloseTo(1, 9);
    expect(s[10]!.ratio).toBeNull();
    const spike = acwrEwmaSeries([...Array(35).fill(60), 300]);
    // Day 36: acute = 300·0.25 + 60·0.75 = 120; chronic = 300·(2/29) + 60·(27/29) = 76.55 → 1.568 (hand calculation).
    expect(spike[35]!.ratio).toBeCloseTo(1.568, 3);
  });

  it("time in zone from a 1 Hz stream with gaps", () => {
    const stream = [...Array(100).fill(130), ...Array(50).fill(160), null, null, ...Array(20).fill(180)];
    expect(timeInZone(stream, 150, 172)).toEqual({ secondsByZone: [100, 50, 20], secondsWithoutData: 2 });
  });

  it("resamples to 1 Hz and leaves long gaps empty", () => {
    const out = toOneHz(
      [
        { timeS: 0, value: 100 },
        { timeS: 2, value: 110 },
        { timeS: 20, value: 120 },
      ],
      5,
    );
    expect(out.slice(0, 4)).toEqual([100, 100, 110, 110]);
    expect(out[10]).toBeNull();
    expect(out[20]).toBe(120);
  });
});
