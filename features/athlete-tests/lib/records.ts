/**
 * What a test stores, built from the engine's results: the detected thresholds and the result kept for charts and reports.
 * Pure, so that the upload route and the demo seed store tests the same way.
 */
import type { ThresholdPair, ThresholdValues } from "@/features/zones/lib/thresholds";
import { analyzeTalkTest, type TalkTestInput } from "@/features/field-tests/lib/talk-test";
import type { Analysis, Threshold } from "@/features/gas-exchange/lib/analyze";
import type { Breath } from "@/features/gas-exchange/lib/csv";

/** Compact chart points: [timeS, vo2MlMin, vco2MlMin, veLMin, hrBpm, powerW, speedKmh]. */
export type PointRow = [number, number, number, number, number | null, number | null, number | null];

export function toRows(points: Breath[]): PointRow[] {
  const r = (v: number | null, d = 0) => (v === null ? null : Math.round(v * 10 ** d) / 10 ** d);
  return points.map((p) => [
    r(p.timeS, 1)!,
    r(p.vo2MlMin)!,
    r(p.vco2MlMin)!,
    r(p.veLMin, 1)!,
    r(p.hrBpm),
    r(p.powerW),
    r(p.speedKmh, 2),
  ]);
}

export function fromRows(rows: PointRow[]): Breath[] {
  return rows.map(([timeS, vo2MlMin, vco2MlMin, veLMin, hrBpm, powerW, speedKmh]) => ({
    timeS,
    vo2MlMin,
    vco2MlMin,
    veLMin,
    hrBpm,
    powerW,
    speedKmh,
    rfPerMin: null,
  }));
}

function thresholdValues(t: Threshold | null): ThresholdValues | null {
  if (!t) return null;
  // Zones take the steady-state workload; the ramp's own values are kept beside it for the report.
  return {
    timeS: t.timeS,
    vo2MlMin: t.vo2MlMin,
    hrBpm: t.hrBpm,
    powerW: t.steadyPowerW ?? t.powerW,
    speedKmh: t.steadySpeedKmh ?? t.speedKmh,
    gradePct: t.steadyGradePct ?? t.gradePct,
    rampPowerW: t.powerW,
    rampSpeedKmh: t.speedKmh,
  };
}

function detail(t: Threshold | null) {
  return t
    ? {
        methods: t.methods,
        methodResults: t.methodResults,
        agreement: t.agreement,
        confidence: t.confidence,
        warnings: t.warnings,
      }
    : null;
}

export function gasExchangeRecord(
  a: Analysis,
  bodyMassKg: number | null,
): { detected: ThresholdPair; result: Record<string, unknown> } {
  return {
    detected: { vt1: thresholdValues(a.vt1), vt2: thresholdValues(a.vt2) },
    result: {
      kind: "gas_exchange",
      points: toRows(a.points),
      peak: a.peak,
      warnings: a.warnings,
      onsetS: a.onsetS,
      endS: a.endS,
      segmentSource: a.segmentSource,
      meanResponseTimeS: a.meanResponseTimeS,
      columns: a.columns,
      breathsRead: a.breathsRead,
      breathsRemoved: a.breathsRemoved,
      bodyMassKg,
      vt1Detail: detail(a.vt1),
      vt1Reason: a.vt1Reason,
      vt2Detail: detail(a.vt2),
      vt2Reason: a.vt2Reason,
    },
  };
}

export function talkTestRecord(talk: TalkTestInput): { detected: ThresholdPair; result: Record<string, unknown> } {
  const r = analyzeTalkTest(talk);
  const unitKey = talk.workloadUnit === "W" ? "powerW" : "speedKmh";
  const v = (t: typeof r.vt1): ThresholdValues | null => (t ? { hrBpm: t.hrBpm, [unitKey]: t.workload } : null);
  return { detected: { vt1: v(r.vt1), vt2: v(r.vt2) }, result: { kind: "talk", ...r } };
}
