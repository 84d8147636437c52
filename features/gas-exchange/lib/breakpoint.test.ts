import { describe, expect, it } from "vitest";
import { linearRegression } from "simple-statistics";
import { fitHinge, fitLine, hingeAt } from "./breakpoint";
import { mulberry32 } from "./synthetic-ramp";

// Deterministic noise so the checks are repeatable.
const rng = mulberry32;

/** Brute force: a fresh 3-parameter least-squares fit per candidate (the O(n²) method the prefix sums replace). The
 * candidates are the data points and seven evenly spaced points between each neighbouring pair. */
function bruteForceHinge(xs: number[], ys: number[], minSeg: number) {
  const idx = xs.map((_, i) => i).sort((a, b) => xs[a]! - xs[b]!);
  const sx = idx.map((i) => xs[i]!),
    sy = idx.map((i) => ys[i]!);
  let best = { rss: Infinity, x0: NaN };
  const candidates: number[] = [];
  for (let k = minSeg; k <= sx.length - minSeg; k++)
    for (let s = 0; s < 8; s++) candidates.push(sx[k - 1]! + (s / 8) * (sx[k]! - sx[k - 1]!));
  for (const x0 of candidates) {
    // Normal equations built directly from the data.
    const rows = sx.map((x) => [1, x, Math.max(0, x - x0)]);
    const A = [0, 1, 2].map((i) => [0, 1, 2].map((j) => rows.reduce((s, r) => s + r[i]! * r[j]!, 0)));
    const r = [0, 1, 2].map((i) => rows.reduce((s, row, q) => s + row[i]! * sy[q]!, 0));
    // Gaussian elimination
    const M = A.map((row, i) => [...row, r[i]!]);
    for (let p = 0; p < 3; p++) {
      for (let q = p + 1; q < 3; q++) {
        const f = M[q]![p]! / M[p]![p]!;
        for (let c = p; c < 4; c++) M[q]![c]! -= f * M[p]![c]!;
      }
    }
    const beta = [0, 0, 0];
    for (let p = 2; p >= 0; p--) {
      let s = M[p]![3]!;
      for (let c = p + 1; c < 3; c++) s -= M[p]![c]! * beta[c]!;
      beta[p] = s / M[p]![p]!;
    }
    const rss = rows.reduce((s, row, q) => s + (sy[q]! - (beta[0]! + beta[1]! * row[1]! + beta[2]! * row[2]!)) ** 2, 0);
    if (rss < best.rss) best = { rss, x0 };
  }
  return best;
}

describe("continuous two-segment regression", () => {
  it("with a fixed knot above, finds the first breakpoint on data that bend twice, and its rss matches a direct fit", () => {
    // Three lines meeting at 2000 and 3000 (by construction), with deterministic noise.
    const r = rng(7);
    const xs = Array.from({ length: 90 }, (_, i) => 1000 + i * 30);
    const ys = xs.map((x) => 0.9 * x + 0.5 * Math.max(0, x - 2000) + 1.5 * Math.max(0, x - 3000) + 20 * (r() - 0.5));
    const withKnot = fitHinge(xs, ys, { knot: 3000 })!;
    expect(Math.abs(withKnot.x0 - 2000)).toBeLessThan(30);
    expect(withKnot.slopeBefore).toBeCloseTo(0.9, 1);
    expect(withKnot.slopeAfter).toBeCloseTo(1.4, 1);
    // A direct least-squares fit with the four terms at the breakpoint found gives the same residual sum of squares.
    const x0 = withKnot.x0;
    const rows = xs.map((x) => [1, x, Math.max(0, x - x0), Math.max(0, x - 3000)]);
    const A = [0, 1, 2, 3].map((i) => [0, 1, 2, 3].map((j) => rows.reduce((s, row) => s + row[i]! * row[j]!, 0)));
    const b = [0, 1, 2, 3].map((i) => rows.reduce((s, row, q) => s + row[i]! * ys[q]!, 0));
    const M = A.map((row, i) => [...row, b[i]!]);
    for (let p = 0; p < 4; p++)
      for (let q = 0; q < 4; q++) {
        if (q === p) continue;
        const f = M[q]![p]! / M[p]![p]!;
        for (let c = p; c < 5; c++) M[q]![c]! -= f * M[p]![c]!;
      }
    const beta = M.map((row, i) => row[4]! / row[i]!);
    const rss = rows.reduce((s, row, q) => s + (ys[q]! - row.reduce((t, v, k) => t + v * beta[k]!, 0)) ** 2, 0);
    expect(withKnot.rss).toBeCloseTo(rss, 3);
    // Without the knot the second bend pulls the single breakpoint away from 2000.
    expect(Math.abs(fitHinge(xs, ys)!.x0 - 2000)).toBeGreaterThan(200);
  });

  it("recovers an exact breakpoint and both slopes from noise-free data", () => {
    const xs = Array.from({ length: 60 }, (_, i) => 1000 + i * 50);
    const ys = xs.map((x) => -100 + 0.95 * x + 0.4 * Math.max(0, x - 2500));
    const fit = fitHinge(xs, ys)!;
    expect(fit.x0).toBeCloseTo(2500, 6);
    expect(fit.slopeBefore).toBeCloseTo(0.95, 9);
    expect(fit.slopeAfter).toBeCloseTo(1.35, 9);
    expect(fit.rss).toBeLessThan(1e-6);
    expect(hingeAt(fit, 3000)).toBeCloseTo(-100 + 0.95 * 3000 + 0.4 * 500, 6);
  });

  it("each segment matches simple-statistics' ordinary least squares on noise-free data", () => {
    // Reference library: simple-statistics linearRegression (REFERENCES.md).
    const xs = Array.from({ length: 40 }, (_, i) => i * 2.5);
    const ys = xs.map((x) => (x <= 50 ? 3 + 0.5 * x : 3 + 0.5 * 50 + 2.0 * (x - 50)));
    const fit = fitHinge(xs, ys)!;
    const left = linearRegression(xs.filter((x) => x <= fit.x0).map((x, i) => [x, ys[i]!]));
    const rightPts = xs.map((x, i) => [x, ys[i]!] as [number, number]).filter(([x]) => x >= fit.x0);
    const right = linearRegression(rightPts);
    expect(fit.slopeBefore).toBeCloseTo(left.m, 8);
    expect(fit.intercept).toBeCloseTo(left.b, 8);
    expect(fit.slopeAfter).toBeCloseTo(right.m, 8);
  });

  it("fitLine agrees with simple-statistics on noisy data", () => {
    const r = rng(7);
    const xs = Array.from({ length: 200 }, () => r() * 100);
    const ys = xs.map((x) => 4 + 1.7 * x + (r() - 0.5) * 20);
    const mine = fitLine(xs, ys);
    const ref = linearRegression(xs.map((x, i) => [x, ys[i]!]));
    expect(mine.slope).toBeCloseTo(ref.m, 9);
    expect(mine.intercept).toBeCloseTo(ref.b, 9);
  });

  it("finds a breakpoint that lies between two data points, not only at one", () => {
    // Points every 100 on x, true breakpoint at 2530: the fit lands within an eighth of the spacing.
    const xs = Array.from({ length: 30 }, (_, i) => 1000 + i * 100);
    const ys = xs.map((x) => 0.9 * x + 0.5 * Math.max(0, x - 2530));
    expect(Math.abs(fitHinge(xs, ys)!.x0 - 2530)).toBeLessThanOrEqual(12.5);
  });

  it("the prefix-sum search finds the same breakpoint as a brute-force refit per candidate", () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const r = rng(seed);
      const xs = Array.from({ length: 150 }, () => 800 + r() * 3000);
      const ys = xs.map((x) => 0.9 * x + 0.5 * Math.max(0, x - 2200) + (r() - 0.5) * 150);
      const fast = fitHinge(xs, ys, { minSegment: 5 })!;
      const slow = bruteForceHinge(xs, ys, 5);
      expect(fast.x0).toBeCloseTo(slow.x0, 6);
      expect(fast.rss).toBeCloseTo(slow.rss, 3);
    }
  });

  it("a straight line gives almost no gain from a breakpoint", () => {
    const r = rng(11);
    const xs = Array.from({ length: 120 }, (_, i) => i);
    const ys = xs.map((x) => 2 + 3 * x + (r() - 0.5) * 10);
    const fit = fitHinge(xs, ys)!;
    expect(fit.gain).toBeLessThan(0.05);
  });

  it("the likelihood-weighted breakpoint misses the true one by less, on average, than the least-squares one", () => {
    // 200 short noisy tests (20 points, the density of a short ramp) with the true breakpoint known by construction. The
    // posterior mean under a flat prior has the smaller expected squared error (a property of Bayes estimators; Carlin,
    // Gelfand & Smith 1992, Appl Stat 41:389–405, treat change points this way). Both fits see the same data.
    let sqLs = 0,
      sqMean = 0;
    for (let seed = 1; seed <= 200; seed++) {
      const r = rng(seed);
      const x0 = 2000 + 400 * r();
      const xs = Array.from({ length: 20 }, (_, i) => 1000 + i * 125);
      const ys = xs.map((x) => 0.95 * x + 0.35 * Math.max(0, x - x0) + 60 * (r() + r() + r() - 1.5));
      const ls = fitHinge(xs, ys, { minSegment: 4 })!;
      const mean = fitHinge(xs, ys, { minSegment: 4, posteriorDof: 1 })!;
      sqLs += (ls.x0 - x0) ** 2;
      sqMean += (mean.x0 - x0) ** 2;
    }
    expect(sqMean).toBeLessThan(0.95 * sqLs);
  });

  it("the likelihood-weighted breakpoint is exact on noise-free data, with the slopes refitted there", () => {
    const xs = Array.from({ length: 60 }, (_, i) => 1000 + i * 50);
    const ys = xs.map((x) => -100 + 0.95 * x + 0.4 * Math.max(0, x - 2530));
    const fit = fitHinge(xs, ys, { posteriorDof: 1 })!;
    // Candidates lie an eighth of the 50-unit spacing apart: the nearest to 2530 is 1.25 away.
    expect(Math.abs(fit.x0 - 2530)).toBeLessThanOrEqual(3.2);
    expect(fit.slopeBefore).toBeCloseTo(0.95, 2);
    expect(fit.slopeAfter).toBeCloseTo(1.35, 2);
  });

  it("refuses too few points", () => {
    expect(fitHinge([1, 2, 3], [1, 2, 3])).toBeNull();
  });
});
