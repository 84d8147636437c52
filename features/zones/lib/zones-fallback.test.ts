// The zones a session's targets come from when its sport has none yet: the nearest sport's heart rate only. The sport
// order is our own (common practice: similar muscle mass and posture respond alike); the checks are of the rule itself.
import { describe, expect, it } from "vitest";
import { threeZones, zonesForSession } from "./zones";

const running = {
  sport: "running",
  effectiveFrom: "2026-10-01",
  zones: threeZones({ hrBpm: 150, speedKmh: 11 }, { hrBpm: 172, speedKmh: 14 }),
};
const cycling = {
  sport: "cycling",
  effectiveFrom: "2026-11-01",
  zones: threeZones({ hrBpm: 140, powerW: 200 }, { hrBpm: 165, powerW: 280 }),
};

describe("zones for a session", () => {
  it("a session of the zones' own sport uses them whole", () => {
    const found = zonesForSession([running, cycling], "running", "2026-12-01");
    expect(found?.fromSport).toBeNull();
    expect(found?.set.zones[1]!.ranges.speedKmh).toBeDefined();
  });

  it("a sport without zones takes the nearest sport's heart rate only, and says which sport", () => {
    const found = zonesForSession([running], "cycling", "2026-12-01");
    expect(found?.fromSport).toBe("running");
    for (const z of found!.set.zones) expect(Object.keys(z.ranges)).toEqual(["hrBpm"]);
    expect(found!.set.zones[1]!.ranges.hrBpm).toEqual(running.zones[1]!.ranges.hrBpm);
  });

  it("the nearest sport wins: a walk takes the running zones before the cycling ones", () => {
    expect(zonesForSession([cycling, running], "walking", "2026-12-01")?.fromSport).toBe("running");
    expect(zonesForSession([cycling, running], "rowing", "2026-12-01")?.fromSport).toBe("cycling");
  });

  it("only zones in force on the session's day count; none at all gives none", () => {
    expect(zonesForSession([cycling], "running", "2026-10-15")).toBeNull();
    expect(zonesForSession([], "running", "2026-12-01")).toBeNull();
  });
});
