import type { FuelProfile } from "@/features/physiology/lib/fuel";
import type { ZoneSetView } from "@/features/zones/lib/views";
import type { ThresholdPair } from "@/features/zones/lib/thresholds";

/** A test as the server sends it to its page, report and the API. */
export interface TestView {
  id: string;
  athleteId: string;
  athleteName: string;
  kind: "gas_exchange" | "talk" | "submax" | "manual";
  sport: string;
  protocol: string;
  date: string;
  endedBy: "exhaustion" | "plan" | "stop_sign";
  stopSign: string | null;
  bodyMassKg: number | null;
  /** What was entered: talk-test stages, submaximal stages, the CSV column mapping. */
  input: Record<string, unknown>;
  /** The engine's full result (analysis points for the charts, peak, warnings). */
  result: Record<string, unknown>;
  detected: ThresholdPair;
  adjusted: ThresholdPair | null;
  adjustedBy: string | null;
  adjustedAt: Date | null;
  effective: ThresholdPair;
  zoneSet: ZoneSetView | null;
  fuel: FuelProfile | null;
  file: { filename: string; sizeBytes: number } | null;
}
