"use client";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { ScatterChart, type Marker } from "@/features/charts/components/ScatterChart";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { mmss } from "@/features/platform/lib/format";
import { putSegment } from "../api";

type PointRow = [number, number, ...unknown[]];

export interface SegmentEditorProps {
  testId: string;
  /** The averaged points of the whole file: [time s, VO2 mL/min, …]. */
  rows: PointRow[];
  onsetS: number;
  endS: number;
  source: "workload" | "vo2" | "chosen";
  canEdit: boolean;
}

const START_COLOR = "#1f6f3d";
const END_COLOR = "#8a2c1b";
/** The shortest segment the engine is asked to search (the server refuses less than a minute). */
const MIN_SPAN_S = 120;

const SOURCE_TEXT: Record<SegmentEditorProps["source"], string> = {
  workload: "Tidemark found the test segment from the workload.",
  vo2: "The file has no workload column, so Tidemark found the test segment from VO2 alone: check its start and end.",
  chosen: "A coach set this test segment by hand.",
};

/**
 * The test segment on a VO2-over-time chart of the whole file, with a start and an end handle. Moving them and asking for
 * a new search analyses the stored file again inside the segment (thresholds a coach had moved are cleared).
 */
export function SegmentEditor(p: SegmentEditorProps) {
  const router = useRouter();
  const times = useMemo(() => p.rows.map((r) => r[0]), [p.rows]);
  const [from, setFrom] = useState(p.onsetS);
  const [to, setTo] = useState(p.endS);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ kind: "ok" | "error"; text: string }>();
  const dirty = Math.round(from) !== Math.round(p.onsetS) || Math.round(to) !== Math.round(p.endS);
  const snap = (t: number) => times.reduce((b, x) => (Math.abs(x - t) < Math.abs(b - t) ? x : b), times[0] ?? 0);
  const step = (t: number, dir: -1 | 1) => {
    const i = times.findIndex((x) => x >= t - 0.01);
    return times[Math.max(0, Math.min(times.length - 1, (i < 0 ? times.length - 1 : i) + dir))]!;
  };
  const moveFrom = (t: number) => {
    setMessage(undefined);
    setFrom(Math.min(snap(t), to - MIN_SPAN_S));
  };
  const moveTo = (t: number) => {
    setMessage(undefined);
    setTo(Math.max(snap(t), from + MIN_SPAN_S));
  };
  const markers: Marker[] = [
    {
      id: "segment-start",
      label: "Start",
      x: from,
      color: START_COLOR,
      onMove: p.canEdit ? moveFrom : undefined,
      onStep: p.canEdit ? (d) => moveFrom(step(from, d)) : undefined,
    },
    {
      id: "segment-end",
      label: "End",
      x: to,
      color: END_COLOR,
      onMove: p.canEdit ? moveTo : undefined,
      onStep: p.canEdit ? (d) => moveTo(step(to, d)) : undefined,
    },
  ];

  async function search(segment: { fromS: number | null; toS: number | null }) {
    setBusy(true);
    setMessage(undefined);
    try {
      await putSegment(p.testId, segment);
      setMessage({ kind: "ok", text: "Analysed again. The thresholds and zones below come from this segment." });
      router.refresh();
    } catch (e) {
      setMessage({ kind: "error", text: e instanceof Error ? e.message : "The new search failed." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card space-y-3" aria-labelledby="segment-h">
      <h2 id="segment-h" className="text-lg font-bold">
        Test segment
      </h2>
      <p className="text-sm">
        {SOURCE_TEXT[p.source]} Thresholds are searched only between the start and the end:{" "}
        <span className="num font-semibold" data-testid="segment-range">
          {mmss(from)}–{mmss(to)} min:s
        </span>
        .
      </p>
      <ScatterChart
        title="VO2 over the whole file"
        xLabel="Time (min:s)"
        yLabel="VO2 (mL/min)"
        series={[
          { label: "VO2, averaged points", kind: "line", points: p.rows.map((r) => [r[0], r[1]]), color: "#4e5b66" },
        ]}
        markers={markers}
        xFormat={(v) => mmss(v)}
        yFormat={(v) => v.toFixed(0)}
        height={220}
      />
      {p.canEdit ? (
        <div className="flex flex-wrap items-center gap-3" data-print="hide">
          <button
            type="button"
            className="btn"
            disabled={busy || !dirty}
            onClick={() => search({ fromS: Math.round(from), toS: Math.round(to) })}
          >
            {busy ? "Analysing…" : "Find the thresholds in this segment"}
          </button>
          {p.source === "chosen" ? (
            <button
              type="button"
              className="btn-quiet"
              disabled={busy}
              onClick={() => search({ fromS: null, toS: null })}
            >
              Let Tidemark find the segment again
            </button>
          ) : null}
          <p className="text-sm text-ink-soft">
            Drag the start or end handle, or focus it and use the arrow keys. Leave out rest, the warm-up and recovery.
            A new search replaces thresholds moved by hand.
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
    </section>
  );
}
