"use client";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { ScatterChart, type Marker } from "@/features/charts/components/ScatterChart";
import { valuesAt } from "@/features/gas-exchange/lib/analyze";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { mmss } from "@/features/platform/lib/format";
import { patchThresholds } from "../api";
import { fromRows, type PointRow } from "../lib/records";

interface Values {
  timeS?: number | null;
  vo2MlMin?: number | null;
  hrBpm?: number | null;
  powerW?: number | null;
  speedKmh?: number | null;
}
interface Detail {
  methods: string[];
  confidence: number;
  agreement: { differenceMlMin: number; differencePct: number } | null;
  warnings: string[];
}

export interface GasExchangeResultProps {
  testId: string;
  rows: PointRow[];
  onsetS: number;
  endS: number;
  bodyMassKg: number | null;
  detected: { vt1: Values | null; vt2: Values | null };
  adjusted: { vt1: Values | null; vt2: Values | null } | null;
  details: { vt1: Detail | null; vt2: Detail | null; vt1Reason: string | null; vt2Reason: string | null };
  canEdit: boolean;
  interactive?: boolean;
}

const VT1_COLOR = "#0f5e63";
const VT2_COLOR = "#4a1d45";
const METHOD_NAMES: Record<string, string> = {
  "v-slope": "V-slope",
  "ventilatory-equivalents": "ventilatory equivalents",
  "ve-vco2-slope": "VE–VCO2 slope",
  "ve-vco2-ratio": "VE/VCO2 rise",
};

function ThresholdCard({
  label,
  color,
  v,
  mass,
  detail,
  reason,
  isAdjusted,
}: {
  label: string;
  color: string;
  v: ReturnType<typeof valuesAt> | null;
  mass: number | null;
  detail: Detail | null;
  reason: string | null;
  isAdjusted: boolean;
}) {
  return (
    <section className="card space-y-2" aria-label={label} data-testid={`card-${label}`}>
      <h3 className="flex items-center gap-2 text-lg font-bold">
        <span aria-hidden className="inline-block h-3 w-3 rounded-full" style={{ background: color }} />
        {label}
        <span className="text-sm font-normal text-ink-soft">{isAdjusted ? "adjusted by a coach" : "as detected"}</span>
      </h3>
      {v ? (
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">Time</dt>
          <dd className="num">{mmss(v.timeS)} min:s</dd>
          <dt className="text-ink-soft">VO2</dt>
          <dd className="num" data-testid={`${label}-vo2`}>
            {v.vo2MlMin} mL/min{mass ? ` · ${(v.vo2MlMin / mass).toFixed(1)} mL/kg/min` : ""}
          </dd>
          <dt className="text-ink-soft">Heart rate</dt>
          <dd className="num" data-testid={`${label}-hr`}>
            {v.hrBpm !== null ? `${v.hrBpm} bpm` : "not recorded"}
          </dd>
          <dt className="text-ink-soft">VCO2 · RER</dt>
          <dd className="num">
            {v.vco2MlMin} mL/min · {v.rer}
          </dd>
          {v.powerW !== null ? (
            <>
              <dt className="text-ink-soft">
                Power <span className="font-normal">(steady state, used for zones)</span>
              </dt>
              <dd className="num" data-testid={`${label}-power`}>
                {v.steadyPowerW ?? v.powerW} W · {v.powerW} W on the ramp
              </dd>
            </>
          ) : null}
          {v.speedKmh !== null ? (
            <>
              <dt className="text-ink-soft">
                Speed <span className="font-normal">(steady state, used for zones)</span>
              </dt>
              <dd className="num">
                {v.steadySpeedKmh ?? v.speedKmh} km/h · {v.speedKmh} km/h on the ramp
              </dd>
            </>
          ) : null}
        </dl>
      ) : (
        <p className="text-sm">{reason ?? "Not found."} Drag the marker onto the curves to set it by hand.</p>
      )}
      {detail && !isAdjusted ? (
        <div className="text-xs text-ink-soft">
          <p>
            Methods: {detail.methods.map((m) => METHOD_NAMES[m] ?? m).join(" + ")}
            {detail.agreement
              ? ` · ${detail.agreement.differencePct} % apart (${detail.agreement.differenceMlMin} mL/min)`
              : " · not cross-checked"}{" "}
            · confidence {detail.confidence.toFixed(2)} of 1
          </p>
          {detail.warnings.map((w) => (
            <p key={w}>{w}</p>
          ))}
        </div>
      ) : null}
    </section>
  );
}

export function GasExchangeResult(p: GasExchangeResultProps) {
  const router = useRouter();
  const points = useMemo(() => fromRows(p.rows), [p.rows]);
  const exercise = useMemo(
    () => points.filter((b) => b.timeS >= p.onsetS && b.timeS <= p.endS),
    [points, p.onsetS, p.endS],
  );
  const effective = p.adjusted ?? p.detected;
  const [t1, setT1] = useState<number | null>(effective.vt1?.timeS ?? null);
  const [t2, setT2] = useState<number | null>(effective.vt2?.timeS ?? null);
  const [message, setMessage] = useState<{ kind: "ok" | "error"; text: string }>();
  const [busy, setBusy] = useState(false);
  const dirty = t1 !== (effective.vt1?.timeS ?? null) || t2 !== (effective.vt2?.timeS ?? null);
  const interactive = (p.interactive ?? true) && p.canEdit;
  const v1 = t1 !== null ? valuesAt(points, t1, p.bodyMassKg) : null;
  const v2 = t2 !== null ? valuesAt(points, t2, p.bodyMassKg) : null;
  const snapTime = (t: number) =>
    exercise.reduce((b, q) => (Math.abs(q.timeS - t) < Math.abs(b.timeS - t) ? q : b), exercise[0]!).timeS;
  const snapBy = (key: "vo2MlMin" | "vco2MlMin", x: number) =>
    exercise.reduce((b, q) => (Math.abs(q[key] - x) < Math.abs(b[key] - x) ? q : b), exercise[0]!).timeS;
  const step = (t: number | null, dir: -1 | 1) => {
    const times = exercise.map((q) => q.timeS);
    const i = t === null ? 0 : times.findIndex((x) => x >= t - 0.01);
    return times[Math.max(0, Math.min(times.length - 1, (i < 0 ? times.length - 1 : i) + dir))]!;
  };
  const setter = (which: 1 | 2) => (t: number) => {
    setMessage(undefined);
    if (which === 1) setT1(t2 !== null ? Math.min(t, step(t2, -1)) : t);
    else setT2(t1 !== null ? Math.max(t, step(t1, 1)) : t);
  };
  const mid = exercise[Math.floor(exercise.length / 2)]?.timeS ?? 0;
  const markers = (x: (t: number) => number, fromX: (x: number) => number): Marker[] => [
    {
      id: "vt1",
      label: "VT1",
      x: x(t1 ?? mid),
      color: VT1_COLOR,
      onMove: interactive ? (v) => setter(1)(fromX(v)) : undefined,
      onStep: interactive ? (d) => setter(1)(step(t1 ?? mid, d)) : undefined,
    },
    {
      id: "vt2",
      label: "VT2",
      x: x(t2 ?? mid),
      color: VT2_COLOR,
      onMove: interactive ? (v) => setter(2)(fromX(v)) : undefined,
      onStep: interactive ? (d) => setter(2)(step(t2 ?? mid, d)) : undefined,
    },
  ];
  const at = (t: number) => valuesAt(points, t, null);
  const vo2At = (t: number) => at(t).vo2MlMin;
  const vco2At = (t: number) => at(t).vco2MlMin;
  const minutes = (v: number) => mmss(v);

  async function save() {
    setBusy(true);
    setMessage(undefined);
    try {
      await patchThresholds(p.testId, {
        vt1: t1 === null ? null : { timeS: t1 },
        vt2: t2 === null ? null : { timeS: t2 },
      });
      setMessage({ kind: "ok", text: "Saved. The zone set now uses these thresholds; the detected values are kept." });
      router.refresh();
    } catch (e) {
      setMessage({ kind: "error", text: e instanceof Error ? e.message : "Saving failed." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-6">
      <div className="grid gap-4 md:grid-cols-2">
        <ThresholdCard
          label="VT1"
          color={VT1_COLOR}
          v={v1}
          mass={p.bodyMassKg}
          detail={p.details.vt1}
          reason={p.details.vt1Reason}
          isAdjusted={!!p.adjusted || dirty}
        />
        <ThresholdCard
          label="VT2"
          color={VT2_COLOR}
          v={v2}
          mass={p.bodyMassKg}
          detail={p.details.vt2}
          reason={p.details.vt2Reason}
          isAdjusted={!!p.adjusted || dirty}
        />
      </div>
      {interactive ? (
        <div className="flex flex-wrap items-center gap-3" data-print="hide">
          <button
            type="button"
            className="btn"
            onClick={save}
            disabled={busy || (!dirty && !!p.adjusted) || t1 === null || t2 === null}
          >
            {busy ? "Saving…" : "Save thresholds and zones"}
          </button>
          <button
            type="button"
            className="btn-quiet"
            onClick={() => {
              setT1(p.detected.vt1?.timeS ?? null);
              setT2(p.detected.vt2?.timeS ?? null);
            }}
          >
            Back to the detected values
          </button>
          <p className="text-sm text-ink-soft">
            Drag a marker on any chart, or focus it and use the arrow keys; the numbers follow.
          </p>
          {message ? (
            message.kind === "ok" ? (
              <FormNotice>{message.text}</FormNotice>
            ) : (
              <FormAlert>{message.text}</FormAlert>
            )
          ) : null}
        </div>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-2">
        <ScatterChart
          title="V-slope: VCO2 against VO2"
          xLabel="VO2 (mL/min)"
          yLabel="VCO2 (mL/min)"
          series={[
            {
              label: "VCO2 against VO2, averaged points",
              kind: "dots",
              points: exercise.map((q) => [q.vo2MlMin, q.vco2MlMin]),
              color: "#4e5b66",
            },
          ]}
          markers={markers(vo2At, (x) => snapBy("vo2MlMin", x))}
          xFormat={(v) => v.toFixed(0)}
          yFormat={(v) => v.toFixed(0)}
        />
        <ScatterChart
          title="Ventilatory equivalents over time"
          xLabel="Time (min:s)"
          yLabel="VE/VO2 and VE/VCO2 (L/L)"
          series={[
            {
              label: "VE/VO2",
              kind: "line",
              points: exercise.map((q) => [q.timeS, (q.veLMin / q.vo2MlMin) * 1000]),
              color: "#0f5e63",
            },
            {
              label: "VE/VCO2",
              kind: "line",
              points: exercise.map((q) => [q.timeS, (q.veLMin / q.vco2MlMin) * 1000]),
              color: "#c8942c",
            },
          ]}
          markers={markers((t) => t, snapTime)}
          xFormat={minutes}
          yFormat={(v) => v.toFixed(0)}
        />
        <ScatterChart
          title="VE against VCO2"
          xLabel="VCO2 (mL/min)"
          yLabel="VE (L/min)"
          series={[
            {
              label: "VE against VCO2, averaged points",
              kind: "dots",
              points: exercise.map((q) => [q.vco2MlMin, q.veLMin]),
              color: "#4e5b66",
            },
          ]}
          markers={markers(vco2At, (x) => snapBy("vco2MlMin", x))}
          xFormat={(v) => v.toFixed(0)}
          yFormat={(v) => v.toFixed(0)}
        />
        {exercise.some((q) => q.hrBpm !== null) ? (
          <ScatterChart
            title="Heart rate over time"
            xLabel="Time (min:s)"
            yLabel="Heart rate (bpm)"
            series={[
              {
                label: "Heart rate",
                kind: "line",
                points: exercise.filter((q) => q.hrBpm !== null).map((q) => [q.timeS, q.hrBpm!]),
                color: "#8a2c1b",
              },
            ]}
            markers={markers((t) => t, snapTime)}
            xFormat={minutes}
            yFormat={(v) => v.toFixed(0)}
          />
        ) : (
          <p className="text-sm text-ink-soft">The file has no heart rate, so the zones are in power or speed only.</p>
        )}
      </div>
    </div>
  );
}
