import { describe, expect, it } from "vitest";
import { acsmCyclingVo2, acsmRunningVo2, acsmWalkingVo2, karvonenHr, metsFromVo2, predictedHrMax } from "./equations";

describe("metabolic equations", () => {
  it("ACSM walking: 80.4 m/min at 5 % → 18.8 mL/kg/min (ACSM's Guidelines for Exercise Testing and Prescription)", () => {
    expect(acsmWalkingVo2(80.4, 0.05)).toBeCloseTo(18.8, 1);
  });
  it("ACSM running: 160.9 m/min at 0 % → 35.7 mL/kg/min (ACSM's Guidelines)", () => {
    expect(acsmRunningVo2(160.9, 0)).toBeCloseTo(35.7, 1);
  });
  it("ACSM leg cycling: 150 W, 70 kg → 30.6 mL/kg/min (ACSM's Guidelines; 1 W = 6.12 kg·m/min)", () => {
    expect(acsmCyclingVo2(150, 70)).toBeCloseTo(30.6, 1);
  });
  it("1 MET = 3.5 mL/kg/min: 35 → 10 MET (ACSM's Guidelines)", () => {
    expect(metsFromVo2(35)).toBe(10);
  });
});

describe("maximal heart rate and reserve", () => {
  it("Tanaka, Monahan & Seals 2001: age 40 → 180", () => expect(predictedHrMax(40, "tanaka")).toBe(180));
  it("Gellish et al. 2007: age 40 → 179", () => expect(predictedHrMax(40, "gellish")).toBe(179));
  it("traditional 220 − age: age 40 → 180", () => expect(predictedHrMax(40, "traditional")).toBe(180));
  it("Karvonen 1957: rest 60, max 180, 70 % → 144", () => expect(karvonenHr(60, 180, 0.7)).toBe(144));
});
