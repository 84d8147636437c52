// Bounds on what a session may hold (issue: edge inputs gave 500s or absurd data); limits are the product's own.
import { describe, expect, it } from "vitest";
import { structureSchema } from "./session";

describe("bounds on a session's structure", () => {
  it("refuses repeat groups nested hundreds deep before parsing them, with the reason", () => {
    let deep: unknown = [{ type: "step", kind: "work", durationS: 60, zone: 1 }];
    for (let i = 0; i < 800; i++) deep = [{ type: "repeat", times: 2, steps: deep }];
    const r = structureSchema.safeParse(deep);
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.message)).toEqual(["Repeat groups nest at most 3 deep."]);
  });
  it("refuses a session that adds up to more than 12 hours, or 300 km", () => {
    const long = structureSchema.safeParse([
      { type: "repeat", times: 50, steps: [{ type: "step", kind: "work", durationS: 12 * 3600, zone: 1 }] },
    ]);
    expect(long.success).toBe(false);
    expect(long.error!.issues[0]!.message).toMatch(/at most 12 hours; this one adds up to 600 hours/);
    const far = structureSchema.safeParse([
      { type: "repeat", times: 10, steps: [{ type: "step", kind: "work", distanceM: 100_000, zone: 1 }] },
    ]);
    expect(far.error!.issues[0]!.message).toMatch(/at most 300 km/);
    expect(structureSchema.safeParse([{ type: "step", kind: "work", durationS: 4 * 3600, zone: 1 }]).success).toBe(
      true,
    );
  });
});
