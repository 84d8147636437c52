/** Threshold values as stored with a test and a zone set (the JSON columns of db/schema.ts). */
export interface ThresholdValues {
  timeS?: number | null;
  vo2MlMin?: number | null;
  hrBpm?: number | null;
  /** Steady-state power and speed (a ramp's values corrected for the VO2 response time); zones use these. */
  powerW?: number | null;
  speedKmh?: number | null;
  gradePct?: number | null;
  /** The uncorrected values where VO2 showed the threshold on a ramp. */
  rampPowerW?: number | null;
  rampSpeedKmh?: number | null;
}
export interface ThresholdPair {
  vt1: ThresholdValues | null;
  vt2: ThresholdValues | null;
}
