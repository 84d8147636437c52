// Zone 1's shown lower end: the light-intensity floor of maximal heart rate (57 % HRmax; Garber et al. 2011, ACSM
// position stand, intensity table, figures from memory). Hand-worked: HRmax 188 → 0.57 × 188 = 107.2 → 107 bpm.
import { describe, expect, it } from "vitest";
import { rangeText, targetText } from "./format";
import { fiveZones, threeZones, withShownFloor, zoneOf } from "./zones";

const zones = threeZones({ hrBpm: 150, powerW: 200 }, { hrBpm: 172, powerW: 270 });

describe("zone 1's shown lower end", () => {
  it("reads from the light-intensity floor, and still ends a step below VT1", () => {
    const shown = withShownFloor(zones, 188);
    expect(rangeText("hrBpm", shown[0]!.ranges.hrBpm)).toBe("107–149 bpm");
    expect(targetText(shown[0], "running")).toBe("107–149 bpm · below 200 W");
    // Other zones and measures are untouched.
    expect(rangeText("hrBpm", shown[1]!.ranges.hrBpm)).toBe("150–171 bpm");
    expect(rangeText("powerW", shown[0]!.ranges.powerW)).toBe("below 200 W");
  });

  it("without a known maximum, or with a floor above VT1, zone 1 stays open below", () => {
    expect(rangeText("hrBpm", withShownFloor(zones, null)[0]!.ranges.hrBpm)).toBe("below 150 bpm");
    expect(rangeText("hrBpm", withShownFloor(zones, 300)[0]!.ranges.hrBpm)).toBe("below 150 bpm");
  });

  it("an easy effort below the floor still counts as zone 1 (the floor is only shown)", () => {
    const shown = withShownFloor(zones, 188);
    expect(zoneOf(95, shown, "hrBpm")).toBe(1);
  });

  it("in five zones only the lowest, open one gets the floor", () => {
    const five = withShownFloor(fiveZones({ hrBpm: 150 }, { hrBpm: 172 }), 188);
    const open = five.filter((z) => z.ranges.hrBpm?.shownFrom !== undefined);
    expect(open).toHaveLength(1);
    expect(open[0]!.zone).toBe(1);
  });
});
