import { describe, expect, it } from "vitest";
import { carbohydrateShare, fraynOxidation, fuelProfile, jeukendrupWallisOxidation, weirKcalMin } from "./fuel";

describe("fuel use", () => {
  it("Weir 1949 (abbreviated): VO2 2.0, VCO2 1.8 L/min → 9.87 kcal/min", () => {
    expect(weirKcalMin(2.0, 1.8)).toBeCloseTo(9.87, 2);
  });
  it("Frayn 1983: 2.0, 1.8 → CHO 1.77, fat 0.334 g/min", () => {
    const o = fraynOxidation(2.0, 1.8);
    expect(o.choGMin).toBeCloseTo(1.77, 2);
    expect(o.fatGMin).toBeCloseTo(0.334, 3);
  });
  it("Jeukendrup & Wallis 2005: 2.0, 1.8 → CHO 1.654, fat 0.328 g/min", () => {
    const o = jeukendrupWallisOxidation(2.0, 1.8);
    expect(o.choGMin).toBeCloseTo(1.654, 3);
    expect(o.fatGMin).toBeCloseTo(0.328, 3);
  });
  it("non-protein RQ table (Lusk 1924, from memory, ±2 points)", () => {
    const cases: [number, number][] = [
      [0.7, 0],
      [0.8, 33],
      [0.85, 51],
      [0.9, 68],
      [1.0, 100],
    ];
    for (const [rq, pct] of cases) expect(Math.abs(carbohydrateShare(rq) * 100 - pct)).toBeLessThanOrEqual(2);
  });
  it("finds the crossover near RER 0.85 and the maximal fat oxidation on a rising ramp", () => {
    // An invented ramp: VO2 1.0–4.0 L/min, RER 0.78 → 1.05.
    const points = Array.from({ length: 31 }, (_, i) => {
      const vo2 = 1000 + i * 100;
      const rer = 0.78 + (0.27 * i) / 30;
      return { vo2MlMin: vo2, vco2MlMin: vo2 * rer, powerW: 50 + i * 10 };
    });
    const p = fuelProfile(points, { vo2PeakMlMin: 4000 });
    expect(p.crossover!.rer).toBeGreaterThan(0.84);
    expect(p.crossover!.rer).toBeLessThan(0.87);
    // Fat oxidation 1.67·VO2·(1 − RER) peaks where its derivative is zero: analytically at i ≈ 8 (VO2 ≈ 1.8 L/min).
    expect(p.maxFat!.vo2MlMin).toBeGreaterThanOrEqual(1500);
    expect(p.maxFat!.vo2MlMin).toBeLessThanOrEqual(2200);
    expect(p.rows.at(-1)!.fatGMin).toBe(0);
    expect(p.warnings.join(" ")).toMatch(/RER 1.00/);
  });
});
