import { describe, expect, it } from "vitest";
import { anchorOf } from "@/features/logs/lib/cr10";
import { fiveZones, formatPace, paceSPerKm, threeZones, zoneOf, zoneSetInForce, ZoneError } from "./zones";

const vt1 = { hrBpm: 150, powerW: 220, speedKmh: 12 };
const vt2 = { hrBpm: 172, powerW: 300, speedKmh: 15 };

describe("zones from VT1 and VT2 (three-zone model, Seiler & Kjerland 2006)", () => {
  it("gives each zone the CR-10 band of its verbal anchors (Foster et al. 2001: 3 moderate, 4 somewhat hard, 5 hard, 7 very hard)", () => {
    const z = threeZones(vt1, vt2);
    expect(z.map((x) => x.rpe)).toEqual([
      [1, 3],
      [4, 6],
      [7, 10],
    ]);
    // Foster et al. 2001's anchors at the zone edges: zone 1 ends at "moderate", zone 2 starts at "somewhat hard" and
    // zone 3 at "very hard" (our placement of the anchors; common practice).
    expect([anchorOf(3), anchorOf(4), anchorOf(7)]).toEqual(["Moderate", "Somewhat hard", "Very hard"]);
    // The five zones stay inside their parents' bands.
    for (const f of fiveZones(vt1, vt2)) {
      const parent = z[f.parent - 1]!.rpe;
      expect(f.rpe[0]).toBeGreaterThanOrEqual(parent[0]);
      expect(f.rpe[1]).toBeLessThanOrEqual(parent[1]);
    }
  });

  it("bounds zone 1 by VT1, zone 2 by VT1–VT2, zone 3 above VT2, in every measure", () => {
    const z = threeZones(vt1, vt2);
    expect(z.map((x) => x.ranges.hrBpm)).toEqual([
      { min: null, max: 150 },
      { min: 150, max: 172 },
      { min: 172, max: null },
    ]);
    expect(z[1]!.ranges.powerW).toEqual({ min: 220, max: 300 });
    expect(zoneOf(149, z, "hrBpm")).toBe(1);
    expect(zoneOf(150, z, "hrBpm")).toBe(2);
    expect(zoneOf(172, z, "hrBpm")).toBe(3);
    expect(zoneOf(310, z, "powerW")).toBe(3);
  });

  it("leaves out measures that a threshold lacks", () => {
    const z = threeZones({ hrBpm: 150 }, { hrBpm: 170, powerW: 280 });
    expect(Object.keys(z[0]!.ranges)).toEqual(["hrBpm"]);
    expect(zoneOf(200, z, "powerW")).toBeNull();
  });

  it("refuses VT1 at or above VT2", () => {
    expect(() => threeZones({ hrBpm: 170 }, { hrBpm: 160 })).toThrow(ZoneError);
  });

  it("five zones nest inside the three (our subdivision, common practice)", () => {
    const z = fiveZones(vt1, vt2);
    expect(z.map((x) => x.parent)).toEqual([1, 1, 2, 2, 3]);
    expect(z[3]!.ranges.hrBpm).toEqual({ min: 161, max: 172 });
  });

  it("the easy edge is the same effort in every measure: 85 % of VT1 power, carried along the line through the thresholds", () => {
    const z = fiveZones(vt1, vt2);
    // Power edge 0.85 × 220 = 187 W, 33 W below VT1 = 33/80 of the VT1–VT2 span below it (hand calculation):
    // heart rate 150 − 22 × 33/80 = 140.925 bpm, speed 12 − 3 × 33/80 = 10.7625 km/h.
    expect(z[1]!.ranges.powerW!.min).toBeCloseTo(187, 9);
    expect(z[1]!.ranges.hrBpm!.min).toBeCloseTo(140.925, 9);
    expect(z[1]!.ranges.speedKmh!.min).toBeCloseTo(10.7625, 9);
    // Heart rate alone: the edge is 85 % of VT1 heart rate.
    expect(fiveZones({ hrBpm: 150 }, { hrBpm: 172 })[1]!.ranges.hrBpm!.min).toBeCloseTo(127.5, 9);
  });

  it("pace from speed: 12 km/h → 5:00 /km", () => {
    expect(formatPace(paceSPerKm(12))).toBe("5:00 /km");
  });

  it("the zone set in force on a date is the latest effective on or before it", () => {
    const sets = [
      { id: "a", effectiveFrom: "2026-01-10" },
      { id: "b", effectiveFrom: "2026-04-02" },
    ];
    expect(zoneSetInForce(sets, "2026-01-09")).toBeNull();
    expect(zoneSetInForce(sets, "2026-04-01")!.id).toBe("a");
    expect(zoneSetInForce(sets, "2026-04-02")!.id).toBe("b");
  });
});
