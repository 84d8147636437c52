import { describe, expect, it } from "vitest";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import { analyzeBreaths, analyzeCsv } from "./analyze";
import { labCases, labExport } from "./lab-generator";

// Threshold detection against synthetic ramps whose thresholds are known by construction (model documented in
// features/gas-exchange/lib/synthetic-ramp.ts: ACSM leg-cycling VO2, V-slope and VE/VCO2 breakpoints after Beaver, Wasserman & Whipp 1986).
// Tolerances (ours): VT1 within 10 % of the true VO2, VT2 within 8 %, peak VO2 within 5 %, on at least 85 % of 40 tests.

function cases() {
  return Array.from({ length: 40 }, (_, i) => {
    const seed = i + 1;
    return syntheticRamp({
      seed,
      peakW: 250 + ((seed * 37) % 180),
      rampWPerMin: 20 + ((seed * 7) % 16),
      vt1Fraction: 0.42 + ((seed * 13) % 15) / 100,
      vt2Fraction: 0.72 + ((seed * 11) % 10) / 100,
      massKg: 55 + ((seed * 17) % 40),
    });
  });
}

describe("threshold detection on synthetic ramp tests", () => {
  const results = cases().map(({ csv, truth }) => ({ truth, a: analyzeCsv(csv, { bodyMassKg: truth.massKg }) }));

  it("reads every generated file", () => {
    expect(results.every((r) => r.a.ok)).toBe(true);
  });

  it("recovers VT1, VT2 and peak VO2 within tolerance on a large majority", () => {
    let vt1 = 0,
      vt2 = 0,
      peak = 0;
    for (const { truth, a } of results) {
      if (!a.ok) continue;
      if (a.vt1 && Math.abs(a.vt1.vo2MlMin / truth.vt1Vo2MlMin - 1) <= 0.1) vt1++;
      if (a.vt2 && Math.abs(a.vt2.vo2MlMin / truth.vt2Vo2MlMin - 1) <= 0.08) vt2++;
      if (Math.abs(a.peak.vo2MlMin / truth.peakVo2MlMin - 1) <= 0.05) peak++;
    }
    expect(vt1).toBeGreaterThanOrEqual(34);
    expect(vt2).toBeGreaterThanOrEqual(34);
    expect(peak).toBeGreaterThanOrEqual(34);
  });

  it("reports each threshold with heart rate, power, time, methods, agreement and a confidence in 0–1", () => {
    // The generator's default test (a 350 W ramp at 25 W/min).
    const { csv, truth } = syntheticRamp({ seed: 1 });
    const a = analyzeCsv(csv, { bodyMassKg: truth.massKg });
    if (!a.ok || !a.vt1 || !a.vt2) throw new Error("expected both thresholds");
    for (const t of [a.vt1, a.vt2]) {
      expect(t.confidence).toBeGreaterThanOrEqual(0);
      expect(t.confidence).toBeLessThanOrEqual(1);
      expect(t.hrBpm).toBeGreaterThan(60);
      expect(t.powerW).toBeGreaterThan(0);
      expect(t.timeS).toBeGreaterThan(0);
      expect(t.vo2MlKgMin).toBeCloseTo(t.vo2MlMin / truth.massKg, 0);
    }
    expect(a.vt1.methods[0]).toBe("v-slope");
    expect(a.vt2.methods[0]).toBe("ve-vco2-slope");
    expect(a.vt1.timeS).toBeLessThan(a.vt2.timeS);
    // Power at VT1 near the model's VT1 power, allowing for the VO2 lag of a ramp (tau 35 s at 20–35 W/min).
    expect(Math.abs(a.vt1.powerW! - truth.vt1PowerW)).toBeLessThan(45);
    expect(a.peak.rer).toBeGreaterThan(1.05);
  });

  it("a file without breakpoints gets null thresholds with reasons, not numbers", () => {
    const a = analyzeCsv(syntheticRamp({ seed: 5, noBreakpoints: true }).csv);
    if (!a.ok) throw new Error(a.error);
    expect(a.vt1).toBeNull();
    expect(a.vt2).toBeNull();
    expect(a.vt1Reason).toMatch(/VT1 not found/);
    expect(a.vt2Reason).toMatch(/VT2 not found/);
    expect(a.warnings.join(" ")).toMatch(/not found/);
    expect(a.peak.vo2MlMin).toBeGreaterThan(0);
  });

  it("a two-minute file is too short: null thresholds with a warning", () => {
    const a = analyzeCsv(syntheticRamp({ seed: 2, warmupS: 30, peakW: 90, rampWPerMin: 30, recoveryS: 0 }).csv);
    if (!a.ok) throw new Error(a.error);
    expect(a.vt1).toBeNull();
    expect(a.vt2).toBeNull();
    expect(a.warnings.join(" ")).toMatch(/Too few points/);
  });

  it("warns that a short ramp gives less certain thresholds, and not on a ramp of recommended length", () => {
    // 50 → 250 W at 35 W/min is under 6 minutes; at 20 W/min it is 10 minutes (8–12 min recommended: Buchfuhrer et al. 1983).
    const short = analyzeCsv(syntheticRamp({ seed: 3, peakW: 250, rampWPerMin: 35 }).csv);
    const usual = analyzeCsv(syntheticRamp({ seed: 3, peakW: 250, rampWPerMin: 20 }).csv);
    if (!short.ok || !usual.ok) throw new Error("not read");
    expect(short.warnings.join(" ")).toMatch(/shorter than about 8 minutes/);
    expect(usual.warnings.join(" ")).not.toMatch(/shorter than about 8 minutes/);
  });

  it("warns when peak RER stays below 1.05 (probably not maximal)", () => {
    const a = analyzeCsv(syntheticRamp({ seed: 4, noBreakpoints: true }).csv);
    if (!a.ok) throw new Error(a.error);
    expect(a.peak.rer).toBeLessThan(1.05);
    expect(a.warnings.join(" ")).toMatch(/not maximal/);
  });

  it("removes aberrant breaths", () => {
    const a = analyzeCsv(syntheticRamp({ seed: 9, aberrantShare: 0.05 }).csv);
    if (!a.ok) throw new Error(a.error);
    expect(a.breathsRemoved).toBeGreaterThan(0);
    expect(a.breathsRemoved).toBeLessThan(a.breathsRead * 0.12);
  });
});

// The CO2 the body makes reaches the mouth through its CO2 stores, a first-order response (Whipp & Ward 1990), so on a ramp
// VCO2 trails the O2 uptake. VT1 in VO2 terms does not depend on the ramp's slope (Davis et al. 1982, Med Sci Sports Exerc
// 14:339–343). Noise-free ramps built here: VO2 from the ACSM leg-cycling equation with first-order kinetics (τ 35 s),
// VCO2 two lines of VO2 meeting at VT1 (slopes 0.9 and 1.4) passed through a 15-s store, VE two lines of VCO2.
describe("VT1 on ramps of different slopes, with VCO2 trailing through the CO2 stores", () => {
  function ramp(wPerMin: number, storeS: number) {
    const mass = 70,
      vt1 = 2300,
      vt2 = 3100;
    const ss = (w: number) => 7 * mass + 1.8 * 6.12 * w;
    const co2Made = (v: number) => 0.85 * 600 + 0.9 * (v - 600) + 0.5 * Math.max(0, v - vt1);
    const breaths = [];
    let vo2 = ss(50),
      co2 = co2Made(vo2);
    const rampS = (300 / wPerMin) * 60;
    for (let t = 0; t <= 180 + rampS; t++) {
      const w = t < 180 ? 50 : 50 + (wPerMin / 60) * (t - 180);
      vo2 += (ss(w) - vo2) * (1 - Math.exp(-1 / 35));
      co2 += (co2Made(vo2) - co2) * (1 - Math.exp(-1 / storeS));
      const co2AtVt2 = co2Made(vt2);
      const ve = 4 + 0.025 * co2 + 0.025 * Math.max(0, co2 - co2AtVt2);
      if (t % 2 === 0)
        breaths.push({
          timeS: t,
          vo2MlMin: vo2,
          vco2MlMin: co2,
          veLMin: ve,
          hrBpm: null,
          powerW: w,
          speedKmh: null,
          rfPerMin: null,
        });
    }
    return { breaths, vt1 };
  }

  for (const [wPerMin, storeS] of [
    [20, 10],
    [20, 15],
    [30, 15],
    [30, 20],
  ] as const)
    it(`finds VT1 within 2 % of its VO2 on a ${wPerMin} W/min ramp with a ${storeS}-s CO2 store`, () => {
      const { breaths, vt1 } = ramp(wPerMin, storeS);
      const a = analyzeBreaths(breaths);
      expect(a.vt1).not.toBeNull();
      expect(Math.abs(a.vt1!.vo2MlMin / vt1 - 1)).toBeLessThanOrEqual(0.02);
    });
});

describe("test segment on a noisy measured workload", () => {
  it("a rowing ramp after a harder warm-up starts at the ramp, not where one stroke's power dips near the end", () => {
    // A generated rowing test (lab-generator.ts): a warm-up above the ramp's first minutes, then a ramp whose measured
    // stroke power scatters ±15 % from stroke to stroke, exported as 10-s averages. Before, one dip near the end ended
    // the segment 80 s before exhaustion.
    const c = labCases(6).find((x) => x.seed === 1016)!;
    expect(c.protocol).toBe("rowing-ramp");
    const { csv, truth } = labExport(c);
    const a = analyzeCsv(csv);
    if (!a.ok) throw new Error(a.error);
    expect(Math.abs(a.onsetS - truth.rampStartS)).toBeLessThanOrEqual(60);
    expect(Math.abs(a.endS - truth.rampEndS)).toBeLessThanOrEqual(30);
    expect(a.vt1).not.toBeNull();
  });

  it("a continuous ramp exported as 15- or 30-s averages starts where the ramp starts, not three rows later", () => {
    // Each row of such an export rises by about the ramp's own increment, which is under the step tolerance: before, the
    // segment began up to 144 s after the ramp (18 of 72 thirty-second exports more than 45 s late).
    const ramps = labCases(6).filter(
      (c) => (c.style === "avg-30s" || c.style === "avg-15s") && /ramp|speed-grade/.test(c.protocol),
    );
    expect(ramps.length).toBe(144);
    for (const c of ramps) {
      const { csv, truth } = labExport(c);
      const a = analyzeCsv(csv);
      if (!a.ok) throw new Error(a.error);
      const late = a.onsetS - truth.rampStartS;
      expect(late, `${c.protocol} ${c.style} seed ${c.seed}`).toBeLessThanOrEqual(60);
      expect(late, `${c.protocol} ${c.style} seed ${c.seed}`).toBeGreaterThanOrEqual(-90);
    }
  });
});
