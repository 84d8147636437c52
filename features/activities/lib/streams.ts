/**
 * 1 Hz streams from recorded samples, a summary of the activity, time in zone against a zone set's thresholds, and the
 * matching of an activity to the planned session of its day.
 */
import type { Samples, Sport } from "./read";

/** One value per second from the first sample on; NaN is a gap. */
export interface Streams {
  length: number;
  hrBpm: Float64Array;
  powerW: Float64Array;
  speedKmh: Float64Array;
}

export const CHANNELS = ["hrBpm", "powerW", "speedKmh"] as const;
export type StreamChannel = (typeof CHANNELS)[number];

/**
 * Resamples to 1 Hz: each second takes the latest sample at or before it, carried for up to `maxGapS` seconds (a common
 * "smart recording" gap); a longer silence stays a gap. Samples must be in time order (the readers check that).
 */
export function toStreams(s: Samples, maxGapS = 5): Streams {
  const length = s.length ? Math.floor(s.timeS[s.length - 1]!) + 1 : 0;
  const out: Streams = {
    length,
    hrBpm: new Float64Array(length).fill(NaN),
    powerW: new Float64Array(length).fill(NaN),
    speedKmh: new Float64Array(length).fill(NaN),
  };
  for (const ch of CHANNELS) {
    const src = s[ch],
      dst = out[ch];
    let j = 0,
      lastT = -Infinity,
      lastV = NaN;
    for (let t = 0; t < length; t++) {
      while (j < s.length && s.timeS[j]! <= t) {
        const v = src[j]!;
        if (!Number.isNaN(v)) {
          lastT = s.timeS[j]!;
          lastV = v;
        }
        j++;
      }
      if (t - lastT <= maxGapS) dst[t] = lastV;
    }
  }
  return out;
}

export interface ActivitySummary {
  /** First to last sample. */
  elapsedS: number;
  /** Seconds with at least one channel recorded. */
  recordedS: number;
  distanceKm: number | null;
  hrAvgBpm: number | null;
  hrMaxBpm: number | null;
  powerAvgW: number | null;
  speedAvgKmh: number | null;
  channels: StreamChannel[];
}

function mean(a: Float64Array): { mean: number | null; max: number | null; count: number } {
  let sum = 0,
    n = 0,
    max = -Infinity;
  for (let i = 0; i < a.length; i++) {
    const v = a[i]!;
    if (Number.isNaN(v)) continue;
    sum += v;
    n++;
    if (v > max) max = v;
  }
  return n ? { mean: sum / n, max, count: n } : { mean: null, max: null, count: 0 };
}

export function summarise(samples: Samples, streams: Streams): ActivitySummary {
  let recorded = 0;
  for (let t = 0; t < streams.length; t++)
    if (!Number.isNaN(streams.hrBpm[t]!) || !Number.isNaN(streams.powerW[t]!) || !Number.isNaN(streams.speedKmh[t]!))
      recorded++;
  let lastDistance = NaN;
  for (let i = samples.length - 1; i >= 0 && Number.isNaN(lastDistance); i--) lastDistance = samples.distanceM[i]!;
  let firstDistance = NaN;
  for (let i = 0; i < samples.length && Number.isNaN(firstDistance); i++) firstDistance = samples.distanceM[i]!;
  const hr = mean(streams.hrBpm),
    power = mean(streams.powerW),
    speed = mean(streams.speedKmh);
  let distanceKm: number | null = Number.isNaN(lastDistance) ? null : Math.max(0, lastDistance - firstDistance) / 1000;
  if (distanceKm === null && speed.count) {
    let metres = 0;
    for (let t = 0; t < streams.length; t++)
      if (!Number.isNaN(streams.speedKmh[t]!)) metres += streams.speedKmh[t]! / 3.6;
    distanceKm = metres / 1000;
  }
  return {
    elapsedS: samples.length ? samples.timeS[samples.length - 1]! - samples.timeS[0]! : 0,
    recordedS: recorded,
    distanceKm,
    hrAvgBpm: hr.mean,
    hrMaxBpm: hr.max,
    powerAvgW: power.count && power.mean! > 0 ? power.mean : null,
    speedAvgKmh: speed.count && speed.mean! > 0 ? speed.mean : null,
    channels: CHANNELS.filter((c) => mean(streams[c]).count > 0),
  };
}

export interface ThresholdBounds {
  hrBpm?: number | null;
  powerW?: number | null;
  speedKmh?: number | null;
}

/** Power first (it answers at once), then heart rate, then speed: the first channel both the file and the zone set have. */
export function chooseMeasure(
  channels: StreamChannel[],
  vt1: ThresholdBounds,
  vt2: ThresholdBounds,
): StreamChannel | null {
  for (const ch of ["powerW", "hrBpm", "speedKmh"] as const)
    if (channels.includes(ch) && vt1[ch] != null && vt2[ch] != null) return ch;
  return null;
}

export interface ZoneTime {
  measure: StreamChannel;
  secondsByZone: [number, number, number];
  minutesByZone: [number, number, number];
  secondsWithoutData: number;
}

/** Seconds below VT1, from VT1 up to VT2, and at or above VT2 (the three-zone model). */
export function zoneTime(streams: Streams, measure: StreamChannel, vt1: number, vt2: number): ZoneTime {
  const a = streams[measure];
  let z1 = 0,
    z2 = 0,
    z3 = 0,
    gaps = 0;
  for (let t = 0; t < a.length; t++) {
    const v = a[t]!;
    if (Number.isNaN(v)) gaps++;
    else if (v < vt1) z1++;
    else if (v < vt2) z2++;
    else z3++;
  }
  const secondsByZone: [number, number, number] = [z1, z2, z3];
  return {
    measure,
    secondsByZone,
    minutesByZone: secondsByZone.map((s) => Math.round((s / 60) * 10) / 10) as [number, number, number],
    secondsWithoutData: gaps,
  };
}

export interface MatchCandidate {
  id: string;
  sport: string;
  totalS: number;
}

/** The planned session an activity belongs to: same sport when the file names one, nearest planned duration. */
export function matchPlanned(candidates: MatchCandidate[], sport: Sport | null, durationS: number): string | null {
  const pool = sport
    ? candidates.filter(
        (c) => c.sport === sport || (c.sport === "triathlon" && ["running", "cycling", "swimming"].includes(sport)),
      )
    : candidates;
  let best: MatchCandidate | null = null;
  for (const c of pool) if (!best || Math.abs(c.totalS - durationS) < Math.abs(best.totalS - durationS)) best = c;
  return best?.id ?? null;
}
