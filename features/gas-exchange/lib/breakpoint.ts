/**
 * Continuous two-segment ("hinge") regression: y = a + b·x + c·max(0, x − x0), with the breakpoint x0 searched over the
 * data points and between them. Sums over the right-hand segment come from suffix sums, so every candidate costs O(1) and the
 * whole search O(n log n) for the sort. Used for the V-slope method (Beaver, Wasserman & Whipp 1986) and the VE/VCO2 breakpoint.
 */

export interface HingeFit {
  /** Breakpoint on the x axis. */
  x0: number;
  intercept: number;
  slopeBefore: number;
  slopeAfter: number;
  /** Residual sum of squares of the hinge fit and of one straight line through all points (with a knot: of the line bent
   * at the knot only). */
  rss: number;
  rssLine: number;
  /** Share of the straight line's residual that the breakpoint removes, 0–1. */
  gain: number;
  n: number;
  nBefore: number;
}

export interface LineFit {
  intercept: number;
  slope: number;
  rss: number;
}

/** Ordinary least squares of y on x. */
export function fitLine(xs: ArrayLike<number>, ys: ArrayLike<number>): LineFit {
  const n = xs.length;
  let sx = 0,
    sy = 0;
  for (let i = 0; i < n; i++) {
    sx += xs[i]!;
    sy += ys[i]!;
  }
  const mx = sx / n,
    my = sy / n;
  let sxx = 0,
    sxy = 0,
    syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = xs[i]! - mx,
      dy = ys[i]! - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  const slope = sxx > 0 ? sxy / sxx : 0;
  return { slope, intercept: my - slope * mx, rss: Math.max(0, syy - slope * sxy) };
}

/** Solves the symmetric 3×3 system [[a, b, c], [b, d, e], [c, e, f]]·β = (r0, r1, r2) by Cramer's rule, without
 * allocating (it runs for every candidate breakpoint); null when singular. */
function solve3(
  a: number,
  b: number,
  c: number,
  d: number,
  e: number,
  f: number,
  r0: number,
  r1: number,
  r2: number,
): [number, number, number] | null {
  const m00 = d * f - e * e,
    m01 = b * f - e * c,
    m02 = b * e - d * c;
  const det = a * m00 - b * m01 + c * m02;
  if (!Number.isFinite(det) || Math.abs(det) < 1e-12) return null;
  const b0 = r0 * m00 - b * (r1 * f - e * r2) + c * (r1 * e - d * r2);
  const b1 = a * (r1 * f - e * r2) - r0 * m01 + c * (b * r2 - r1 * c);
  const b2 = a * (d * r2 - r1 * e) - b * (b * r2 - r1 * c) + r0 * m02;
  return [b0 / det, b1 / det, b2 / det];
}

export interface HingeOptions {
  /** Fewest points on each side of the breakpoint (default 5). */
  minSegment?: number;
  /** Only consider breakpoints with x0 inside [lo, hi]. */
  range?: [number, number];
  /**
   * A second, fixed breakpoint (a known change of slope further up, such as the respiratory compensation point): the model
   * gains a term d·max(0, x − knot), so points above it still inform the first segments without bending them. Breakpoints
   * are searched below the knot only.
   */
  knot?: number;
  /**
   * Report the breakpoint as the mean of its profile likelihood over the searched range instead of the single best
   * candidate: each candidate x0 is weighted by (rss(x0) / rss_min)^(−ν/2), the likelihood of a Gaussian model with its
   * variance integrated out, and ν = `posteriorDof` × (n − parameters). With noisy data the least-squares breakpoint jumps
   * between nearby local minima; the mean over the likelihood has the smaller expected squared error (the posterior mean
   * under a flat prior). A factor below 1 allows for residuals that are correlated (smoothed data).
   */
  posteriorDof?: number;
}

/** Solves the 4×4 system m·β = r (m row-major, 16 values; r 4 values) by Gaussian elimination with partial pivoting, in the
 * scratch array `w` (20 values); null when singular. */
function solve4(m: ArrayLike<number>, r: ArrayLike<number>, w: Float64Array, out: Float64Array): Float64Array | null {
  for (let i = 0; i < 4; i++) {
    for (let j = 0; j < 4; j++) w[i * 5 + j] = m[i * 4 + j]!;
    w[i * 5 + 4] = r[i]!;
  }
  for (let c = 0; c < 4; c++) {
    let p = c;
    for (let i = c + 1; i < 4; i++) if (Math.abs(w[i * 5 + c]!) > Math.abs(w[p * 5 + c]!)) p = i;
    if (p !== c)
      for (let j = 0; j < 5; j++) {
        const t = w[c * 5 + j]!;
        w[c * 5 + j] = w[p * 5 + j]!;
        w[p * 5 + j] = t;
      }
    const d = w[c * 5 + c]!;
    if (!Number.isFinite(d) || Math.abs(d) < 1e-12) return null;
    for (let i = 0; i < 4; i++) {
      if (i === c) continue;
      const f = w[i * 5 + c]! / d;
      if (f === 0) continue;
      for (let j = c; j < 5; j++) w[i * 5 + j] = w[i * 5 + j]! - f * w[c * 5 + j]!;
    }
  }
  for (let i = 0; i < 4; i++) out[i] = w[i * 5 + 4]! / w[i * 5 + i]!;
  return out;
}

/** Breakpoints tried between two neighbouring data points (the first at the left point): the breakpoint is not bound to
 * the data's x values, which on a short test lie 2–3 % of the range apart. */
const BETWEEN_POINTS = 8;

/** Best continuous two-segment fit; null when there are too few points. */
export function fitHinge(xsIn: ArrayLike<number>, ysIn: ArrayLike<number>, opts: HingeOptions = {}): HingeFit | null {
  const minSeg = Math.max(3, opts.minSegment ?? 5);
  const n = xsIn.length;
  if (n < 2 * minSeg) return null;
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => xsIn[i]! - xsIn[j]!);
  // Centre and scale for numerical stability; the fit is invariant to this.
  let mx = 0,
    my = 0;
  for (let i = 0; i < n; i++) {
    mx += xsIn[i]!;
    my += ysIn[i]!;
  }
  mx /= n;
  my /= n;
  let sdx = 0;
  for (let i = 0; i < n; i++) sdx += (xsIn[i]! - mx) ** 2;
  sdx = Math.sqrt(sdx / n) || 1;
  const x = new Float64Array(n),
    y = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    x[k] = (xsIn[order[k]!]! - mx) / sdx;
    y[k] = ysIn[order[k]!]! - my;
  }
  let Sx = 0,
    Sxx = 0,
    Sy = 0,
    Sxy = 0,
    Syy = 0;
  for (let k = 0; k < n; k++) {
    Sx += x[k]!;
    Sxx += x[k]! * x[k]!;
    Sy += y[k]!;
    Sxy += x[k]! * y[k]!;
    Syy += y[k]! * y[k]!;
  }
  const line = fitLine(x, y);
  // Suffix sums over k..n-1.
  const c = new Float64Array(n + 1),
    s1 = new Float64Array(n + 1),
    s2 = new Float64Array(n + 1);
  const sy = new Float64Array(n + 1),
    sxy = new Float64Array(n + 1);
  for (let k = n - 1; k >= 0; k--) {
    c[k] = c[k + 1]! + 1;
    s1[k] = s1[k + 1]! + x[k]!;
    s2[k] = s2[k + 1]! + x[k]! * x[k]!;
    sy[k] = sy[k + 1]! + y[k]!;
    sxy[k] = sxy[k + 1]! + x[k]! * y[k]!;
  }
  const lo = opts.range ? (opts.range[0] - mx) / sdx : -Infinity;
  let hi = opts.range ? (opts.range[1] - mx) / sdx : Infinity;
  // The fixed knot's term g = max(0, x − knot), its sums, and suffix sums of g and x·g.
  const knot = opts.knot === undefined ? null : (opts.knot - mx) / sdx;
  let Sg = 0,
    Sxg = 0,
    Sgg = 0,
    Sgy = 0;
  const sg = new Float64Array(n + 1),
    sxg = new Float64Array(n + 1);
  if (knot !== null) {
    hi = Math.min(hi, knot);
    for (let k = n - 1; k >= 0; k--) {
      const g = Math.max(0, x[k]! - knot);
      Sg += g;
      Sxg += x[k]! * g;
      Sgg += g * g;
      Sgy += g * y[k]!;
      sg[k] = sg[k + 1]! + g;
      sxg[k] = sxg[k + 1]! + x[k]! * g;
    }
  }
  const m4 = new Float64Array(16),
    r4 = new Float64Array(4),
    w4 = new Float64Array(20),
    o4 = new Float64Array(4);
  let best: { rss: number; k: number; beta: [number, number, number]; x0: number } | null = null;
  // Every candidate and its residual, for the likelihood-weighted mean.
  const keep = !!opts.posteriorDof;
  const tried = new Float64Array(keep ? n * BETWEEN_POINTS : 0),
    triedRss = new Float64Array(keep ? n * BETWEEN_POINTS : 0);
  let nTried = 0;
  // The least-squares hinge with its breakpoint at x0, between x[k-1] and x[k] (points k..n-1 form the right segment).
  const solveAt = (k: number, x0: number): { rss: number; beta: [number, number, number] } | null => {
    const m = c[k]!;
    const Sh = s1[k]! - m * x0;
    const Shh = s2[k]! - 2 * x0 * s1[k]! + m * x0 * x0;
    const Sxh = s2[k]! - x0 * s1[k]!;
    const Shy = sxy[k]! - x0 * sy[k]!;
    if (knot === null) {
      const beta = solve3(n, Sx, Sh, Sxx, Sxh, Shh, Sy, Sxy, Shy);
      return beta ? { rss: Syy - (beta[0] * Sy + beta[1] * Sxy + beta[2] * Shy), beta } : null;
    }
    // With the knot above x0, every point with g > 0 also has h > 0: Σ h·g = Σ_{i≥k} (x − x0)·g.
    const Shg = sxg[k]! - x0 * sg[k]!;
    m4.set([n, Sx, Sh, Sg, Sx, Sxx, Sxh, Sxg, Sh, Sxh, Shh, Shg, Sg, Sxg, Shg, Sgg]);
    r4.set([Sy, Sxy, Shy, Sgy]);
    const beta = solve4(m4, r4, w4, o4);
    if (!beta) return null;
    return {
      rss: Syy - (beta[0]! * Sy + beta[1]! * Sxy + beta[2]! * Shy + beta[3]! * Sgy),
      beta: [beta[0]!, beta[1]!, beta[2]!],
    };
  };
  for (let k = minSeg; k <= n - minSeg; k++) {
    if (x[k]! === x[k - 1]!) continue;
    for (let sub = 0; sub < BETWEEN_POINTS; sub++) {
      const x0 = x[k - 1]! + (sub / BETWEEN_POINTS) * (x[k]! - x[k - 1]!);
      if (x0 < lo || x0 > hi) continue;
      const fit = solveAt(k, x0);
      if (!fit) continue;
      if (keep) {
        tried[nTried] = x0;
        triedRss[nTried++] = fit.rss;
      }
      if (!best || fit.rss < best.rss) best = { rss: fit.rss, k, beta: fit.beta, x0 };
    }
  }
  if (best && keep && nTried > 2 && best.rss > 0) {
    const nu = opts.posteriorDof! * (n - (knot === null ? 4 : 5));
    let sw = 0,
      swx = 0;
    for (let i = 0; i < nTried; i++) {
      // The candidates rise in x0; each stands for half the gap to each neighbour (a flat prior over x0).
      const width = (tried[Math.min(i + 1, nTried - 1)]! - tried[Math.max(i - 1, 0)]!) / 2;
      const w = Math.exp((-nu / 2) * Math.log(Math.max(triedRss[i]!, best.rss) / best.rss)) * width;
      sw += w;
      swx += w * tried[i]!;
    }
    if (sw > 0) {
      // Refit the segments at the mean breakpoint, so the reported slopes belong to it.
      const x0 = swx / sw;
      let k = minSeg;
      while (k < n - minSeg && x[k]! <= x0) k++;
      const fit = solveAt(k, x0);
      if (fit) best = { rss: fit.rss, k, beta: fit.beta, x0 };
    }
  }
  if (!best) return null;
  // What the breakpoint is measured against: one straight line, or with a knot the line bent at the knot alone.
  let base = line.rss;
  if (knot !== null) {
    const lk = solve3(n, Sx, Sg, Sxx, Sxg, Sgg, Sy, Sxy, Sgy);
    if (lk) base = Math.max(0, Syy - (lk[0] * Sy + lk[1] * Sxy + lk[2] * Sgy));
  }
  const [a, b, cc] = best.beta;
  const x0 = best.x0 * sdx + mx;
  const slopeBefore = b / sdx;
  const slopeAfter = (b + cc) / sdx;
  const intercept = a + my - slopeBefore * mx;
  const rss = Math.max(0, best.rss);
  return {
    x0,
    intercept,
    slopeBefore,
    slopeAfter,
    rss,
    rssLine: base,
    gain: base > 0 ? Math.max(0, 1 - rss / base) : 0,
    n,
    nBefore: best.k,
  };
}

/** The hinge model's value at x. */
export function hingeAt(fit: HingeFit, x: number): number {
  return fit.intercept + fit.slopeBefore * x + (fit.slopeAfter - fit.slopeBefore) * Math.max(0, x - fit.x0);
}
