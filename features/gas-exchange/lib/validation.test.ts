// A fixed subset of the validation suite (generated lab tests, model in lab-generator.ts; every protocol, phase pattern
// and export style appears). The full table comes from `npm run validate`.
// The floors below guard against regressions: they are the rates measured on this subset on 2026-12-03 minus about five
// points (VT2 and peak at the product targets minus five, as asked) (command: npx vitest run --project unit validation).
// VT1's floor (85) is below the product target minus five (90): the whole suite meets VT1 95 % on 576 tests (95.5 %) but
// not on 1728 (93.2 %), and this subset measures 89.6 %.
import { describe, expect, it } from "vitest";
import { labCases } from "./lab-generator";
import { rates, runCase } from "./validation";

const subset = labCases(1).filter((_, i) => (i + Math.floor(i / 12)) % 3 === 0);

describe("threshold detection on generated lab tests", () => {
  const results = subset.map(runCase);
  const r = rates(results);

  it("covers every protocol, phase pattern and export style", () => {
    expect(new Set(subset.map((c) => c.protocol)).size).toBe(6);
    expect(new Set(subset.map((c) => c.phase)).size).toBe(4);
    expect(new Set(subset.map((c) => c.style)).size).toBe(12);
  });

  it("keeps its measured detection rates and places (almost) no threshold before the ramp", () => {
    expect(r.peak).toBeGreaterThanOrEqual(FLOORS.peak);
    expect(r.vt2).toBeGreaterThanOrEqual(FLOORS.vt2);
    expect(r.vt1).toBeGreaterThanOrEqual(FLOORS.vt1);
    expect(r.beforeRamp).toBeLessThanOrEqual(FLOORS.early);
  });
});

// Exports averaged every 30 s hold a quarter of a breath file's rows per minute. On 240 such tests with seeds outside the
// suite (10 per cell from seed 20001; command: npx vitest run --project unit validation) VT1 was within 6 % in 93.3 % when
// the V-slope axis was smoothed over ±45 s (one row a side) and in 95.8 % with three rows a side (±90 s).
describe("threshold detection on exports averaged every 30 s", () => {
  const results = labCases(10, 20001)
    .filter((c) => c.style === "avg-30s")
    .map(runCase);

  it("finds VT1 within 6 % in at least 95 % of 240 tests", () => {
    expect(results).toHaveLength(240);
    expect(rates(results).vt1).toBeGreaterThanOrEqual(95);
  });
});

// Measured on this subset: VT1 89.6 %, VT2 96.9 %, peak 99.0 %, no test (of 96) with a threshold before its ramp.
const FLOORS = { vt1: 85, vt2: 92, peak: 93, early: 1 };
