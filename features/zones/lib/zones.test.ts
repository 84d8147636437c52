import { describe, expect, it } from "vitest";
import { fiveZones, formatPace, paceSPerKm, threeZones, zoneOf, zoneSetInForce, ZoneError } from "./zones";

const vt1 = { hrBpm: 150, powerW: 220, speedKmh: 12 };
const vt2 = { hrBpm: 172, powerW: 300, speedKmh: 15 };

describe("zones from VT1 and VT2 (three-zone model, Seiler & Kjerland 2006)", () => {
  it("bounds zone 1 by VT1, zone 2 by VT1–VT2, zone 3 above VT2, in every measure", () => {
    const z = threeZones(vt1, vt2);
    expect(z.map((x) => x.ranges.hrBpm)).toEqual([{ min: null, max: 150 }, { min: 150, max: 172 }, { min: 172, max: null }]);
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
    expect(z[1]!.ranges.hrBpm).toEqual({ min: 127.5, max: 150 });
    expect(z[3]!.ranges.hrBpm).toEqual({ min: 161, max: 172 });
  });

  it("pace from speed: 12 km/h → 5:00 /km", () => {
    expect(formatPace(paceSPerKm(12))).toBe("5:00 /km");
  });

  it("the zone set in force on a date is the latest effective on or before it", () => {
    const sets = [{ id: "a", effectiveFrom: "2026-01-10" }, { id: "b", effectiveFrom: "2026-04-02" }];
    expect(zoneSetInForce(sets, "2026-01-09")).toBeNull();
    expect(zoneSetInForce(sets, "2026-04-01")!.id).toBe("a");
    expect(zoneSetInForce(sets, "2026-04-02")!.id).toBe("b");
  });
});
