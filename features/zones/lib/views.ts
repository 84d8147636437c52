import type { ThresholdValues } from "./thresholds";
import type { Zone } from "./zones";

/** A zone set as the server sends it to pages and the API. */
export interface ZoneSetView {
  id: string;
  sport: string;
  effectiveFrom: string;
  model: "three" | "five";
  source: string;
  testId: string | null;
  vt1: ThresholdValues;
  vt2: ThresholdValues;
  zones: Zone[];
  fiveZones: Zone[] | null;
  /** When a coach chose this set over another of the same sport and day (ISO time), else null. */
  chosenAt: string | null;
}
