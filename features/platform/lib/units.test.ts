// Units: conversions against the exact definitions (international mile 1609.344 m, yard 0.9144 m; NIST Handbook 44,
// Appendix C) and hand-worked paces: 10 km/h is 6:00 per km (3600 s / 10); 6:00 per km is 9:39 per mile
// (360 s × 1.609344 = 579.4 s); a 2:00 split per 500 m is 15 km/h (500 m in 120 s = 4.1667 m/s); 4 km/h swims 100 m in
// 1:30 and 100 yd in 1:22 (91.44 m / 1.1111 m/s = 82.3 s).
import { describe, expect, it } from "vitest";
import { speedRangeText, targetText } from "@/features/zones/lib/format";
import { threeZones } from "@/features/zones/lib/zones";
import { distanceIn, distanceText, METRES_PER_MILE, speedStyle, speedText } from "./units";

describe("units", () => {
  it("each sport's speed in its trade's unit, metric and imperial", () => {
    expect(speedText(10, speedStyle("running"))).toBe("6:00 /km");
    expect(speedText(10, speedStyle("running", "imperial"))).toBe("9:39 /mi");
    expect(speedText(32.1869, speedStyle("cycling", "imperial"))).toBe("20.0 mph");
    expect(speedText(30, speedStyle("cycling"))).toBe("30.0 km/h");
    expect(speedText(15, speedStyle("rowing"))).toBe("2:00 /500 m");
    expect(speedText(15, speedStyle("rowing", "imperial"))).toBe("2:00 /500 m");
    expect(speedText(4, speedStyle("swimming"))).toBe("1:30 /100 m");
    expect(speedText(4, speedStyle("swimming", "imperial"))).toBe("1:22 /100 yd");
    expect(speedText(5, speedStyle("walking", "imperial"))).toBe("19:19 /mi");
  });

  it("distances: metres and km, or yards and miles", () => {
    expect(distanceText(800)).toBe("800 m");
    expect(distanceText(5000)).toBe("5 km");
    expect(distanceText(21097.5)).toBe("21.1 km");
    expect(distanceText(METRES_PER_MILE * 3.1, "imperial")).toBe("3.1 mi");
    expect(distanceText(400, "imperial")).toBe("437 yd");
    expect(distanceText(1500, "imperial", "swimming")).toBe("1640 yd");
    expect(distanceText(1500, "metric", "swimming")).toBe("1500 m");
    expect(distanceIn(10, "imperial")).toBe(6.21);
    expect(distanceIn(10)).toBe(10);
  });

  it("zone ranges in the person's units keep edges that never read as two zones", () => {
    const zones = threeZones({ hrBpm: 150, speedKmh: 12 }, { hrBpm: 172, speedKmh: 14.4 });
    // 12 km/h = 5:00 /km = 8:03 /mi (300 s × 1.609344 = 482.8 s); 14.4 km/h = 4:10 /km = 6:42 /mi (402.3 s).
    expect(speedRangeText(zones[0]!.ranges.speedKmh, speedStyle("running", "imperial"))).toBe("slower than 8:03 /mi");
    expect(speedRangeText(zones[1]!.ranges.speedKmh, speedStyle("running", "imperial"))).toBe("6:43 /mi – 8:03 /mi");
    expect(speedRangeText(zones[2]!.ranges.speedKmh, speedStyle("running", "imperial"))).toBe("6:42 /mi and faster");
    // 12 km/h = 7.46 mph, 14.4 km/h = 8.95 mph: "7.5–8.9 mph", then "8.9 mph and above" would share 8.9; the closed
    // range stops a shown step below the next zone's first value.
    expect(speedRangeText(zones[1]!.ranges.speedKmh, speedStyle("cycling", "imperial"))).toBe("7.5–8.8 mph");
    expect(speedRangeText(zones[2]!.ranges.speedKmh, speedStyle("cycling", "imperial"))).toBe("8.9 mph and above");
    expect(targetText(zones[1], "running", "imperial")).toBe("6:43 /mi – 8:03 /mi · 150–171 bpm");
    expect(targetText(zones[1], "running")).toBe("4:11 /km – 5:00 /km · 150–171 bpm");
  });
});
