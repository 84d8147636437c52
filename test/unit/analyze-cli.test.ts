// The analysis command on generated files (synthetic ramps, model in features/gas-exchange/lib/synthetic-ramp.ts).
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";

let dir = "";
const run = (args: string[]) =>
  spawnSync(process.execPath, ["--import", "tsx", path.resolve("scripts/analyze.ts"), ...args], { encoding: "utf8" });

beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "tidemark-analyze-"));
  for (let i = 1; i <= 200; i++)
    fs.writeFileSync(path.join(dir, `ramp-${String(i).padStart(3, "0")}.csv`), syntheticRamp({ seed: i }).csv);
  fs.writeFileSync(path.join(dir, "no-ve.csv"), "time,vo2,vco2\n1,1000,900\n");
  fs.writeFileSync(
    path.join(dir, "renamed.csv"),
    syntheticRamp({ seed: 3, headers: ["secs", "oxygen", "carbon", "vent", "pulse", "watts", "breaths"] }).csv,
  );
});

afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe("npm run analyze", () => {
  it("handles two hundred files in one call, one JSON object per line, exit 0", () => {
    const files = fs
      .readdirSync(dir)
      .filter((f) => f.startsWith("ramp-"))
      .map((f) => path.join(dir, f));
    const r = run(["--json", "--mass", "72", ...files]);
    expect(r.status).toBe(0);
    const lines = r.stdout
      .trim()
      .split("\n")
      .map((l) => JSON.parse(l));
    expect(lines).toHaveLength(200);
    const first = lines[0];
    expect(Object.keys(first).sort()).toEqual([
      "breathsRead",
      "columns",
      "file",
      "peak",
      "segment",
      "vt1",
      "vt2",
      "warnings",
    ]);
    expect(Object.keys(first.vt1).sort()).toEqual(
      expect.arrayContaining([
        "vo2MlMin",
        "vco2MlMin",
        "rer",
        "hrBpm",
        "timeS",
        "powerW",
        "steadyPowerW",
        "speedKmh",
        "gradePct",
        "confidence",
        "methods",
        "warnings",
      ]),
    );
    expect(first.vt1.found).toBe(true);
    // The steady-state power lies one mean response time (40 s) back on the 25 W/min ramp: 25 × 40/60 ≈ 17 W lower
    // (the correction of Whipp et al. 1981, workload − ramp rate × MRT; bounds allow for the ±15 s means).
    expect(first.vt1.powerW - first.vt1.steadyPowerW).toBeGreaterThan(10);
    expect(first.vt1.powerW - first.vt1.steadyPowerW).toBeLessThan(25);
    expect(first.peak.vo2MlMin).toBeGreaterThan(3000);
    expect(first.vt1.vo2MlKgMin).toBeCloseTo(first.vt1.vo2MlMin / 72, 0);
  });

  it("reports an unreadable file as an error object and exits 1", () => {
    const r = run([
      "--json",
      path.join(dir, "no-ve.csv"),
      path.join(dir, "ramp-001.csv"),
      path.join(dir, "missing.csv"),
    ]);
    expect(r.status).toBe(1);
    const lines = r.stdout
      .trim()
      .split("\n")
      .map((l) => JSON.parse(l));
    expect(lines[0].error).toMatch(/no column for VE/);
    expect(lines[1].vt1).not.toBeUndefined();
    expect(lines[2].error).toMatch(/cannot read/);
  });

  it("takes a column mapping and prints a readable summary without --json", () => {
    const r = run([
      "--map",
      "time=secs,vo2=oxygen,vco2=carbon,ve=vent,hr=pulse,power=watts",
      path.join(dir, "renamed.csv"),
    ]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/VT1: VO2 \d+ mL\/min/);
    expect(r.stdout).toMatch(/Peak: VO2 \d+ mL\/min/);
    const bad = run(["--map", "oxygen", path.join(dir, "renamed.csv")]);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/NAME=VALUE/);
  });
});
