import { describe, expect, it } from "vitest";
import { paceText, rangeText, targetText } from "./format";
import { threeZones, zoneOf } from "./zones";

// Zones from VT1 150 bpm / 220 W / 10 km/h and VT2 172 bpm / 300 W / 12 km/h (invented thresholds; the edges follow
// zones.ts: a zone holds its lower edge and ends below the next zone's).
describe("zone ranges as read: no value belongs to two zones", () => {
  const z = threeZones({ hrBpm: 150, powerW: 220, speedKmh: 10 }, { hrBpm: 172, powerW: 300, speedKmh: 12 });

  it("heart rate and power: a closed range ends one step below the next zone's first value", () => {
    expect(z.map((x) => rangeText("hrBpm", x.ranges.hrBpm))).toEqual([
      "below 150 bpm",
      "150–171 bpm",
      "172 bpm and above",
    ]);
    expect(z.map((x) => rangeText("powerW", x.ranges.powerW))).toEqual(["below 220 W", "220–299 W", "300 W and above"]);
    // What each shown edge value is, by the zones' own rule.
    expect([zoneOf(171, z, "hrBpm"), zoneOf(172, z, "hrBpm")]).toEqual([2, 3]);
  });

  it("speed in tenths, and pace with the bounds swapped a second apart (10 km/h = 6:00 /km, 12 km/h = 5:00 /km)", () => {
    expect(rangeText("speedKmh", z[1]!.ranges.speedKmh)).toBe("10.0–11.9 km/h");
    expect(z.map((x) => paceText(x.ranges.speedKmh))).toEqual([
      "slower than 6:00 /km",
      "5:01 /km – 6:00 /km",
      "5:00 /km and faster",
    ]);
  });
});

describe("a step's target names the sport's own measure first (common practice)", () => {
  const z = threeZones({ hrBpm: 150, powerW: 220, speedKmh: 10 }, { hrBpm: 172, powerW: 300, speedKmh: 12 });
  it("a runner reads pace first and power last; a cyclist power first; other sports heart rate first", () => {
    expect(targetText(z[1], "running")).toBe("5:01 /km – 6:00 /km · 150–171 bpm · 220–299 W");
    expect(targetText(z[1], "cycling")).toBe("220–299 W · 150–171 bpm · 10.0–11.9 km/h");
    expect(targetText(z[1], "triathlon")!.startsWith("150–171 bpm")).toBe(true);
  });
});
