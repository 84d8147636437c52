import { describe, expect, it } from "vitest";
import { detectDrift, type DriftEntry } from "./drift";

// Invented series (method documented in drift.ts, our own; threshold 5 bpm is common practice, from memory).
const day = (n: number) => new Date(Date.UTC(2026, 8, 1 + n)).toISOString().slice(0, 10);
const line = (x: number) => 60 + 0.4 * x; // baseline: HR = 60 + 0.4·W

describe("zone drift", () => {
  const baseline: DriftEntry[] = [150, 180, 200, 220, 170].map((x, i) => ({ date: day(i * 4), x, hrAvgBpm: line(x) }));

  it("flags a rise of 8 bpm at the same power, with the numbers (expected from the baseline line by hand)", () => {
    const recent = [180, 200, 190, 210].map((x, i) => ({ date: day(40 + i * 3), x, hrAvgBpm: line(x) + 8 }));
    const r = detectDrift([...baseline, ...recent], day(0), day(52), "W")!;
    expect(r.drifted).toBe(true);
    expect(r.direction).toBe("up");
    expect(r.meanDiffBpm).toBeCloseTo(8, 6);
    expect(r.atX).toBeCloseTo(195, 6);
    expect(r.expectedHrBpm).toBeCloseTo(line(195), 6);
    expect(r.message).toMatch(/195 W/);
  });

  it("flags a fall, naming both readings (gained fitness or overreaching), and stays quiet for noise under the threshold", () => {
    const down = [180, 200, 190].map((x, i) => ({ date: day(40 + i * 3), x, hrAvgBpm: line(x) - 7 }));
    const fall = detectDrift([...baseline, ...down], day(0), day(50), "W")!;
    expect(fall.direction).toBe("down");
    // Overreaching can blunt heart rate too (Meeusen et al. 2013 consensus statement).
    expect(fall.message).toMatch(/Gained fitness.*overreaching.*RPE and load/);
    const noise = [180, 200, 190].map((x, i) => ({ date: day(40 + i * 3), x, hrAvgBpm: line(x) + (i - 1) * 3 }));
    expect(detectDrift([...baseline, ...noise], day(0), day(50), "W")!.drifted).toBe(false);
  });

  it("compares only sessions at the same power (within the baseline's range ±10 %) and needs enough of them", () => {
    const far = [400, 420, 410].map((x, i) => ({ date: day(40 + i * 3), x, hrAvgBpm: line(x) + 20 }));
    expect(detectDrift([...baseline, ...far], day(0), day(50), "W")).toBeNull();
    expect(detectDrift(baseline.slice(0, 2), day(0), day(50), "W")).toBeNull();
  });
});
