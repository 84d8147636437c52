"use client";
/**
 * A small SVG chart of our own: dots or lines on linear axes, with vertical markers that can be dragged with the pointer or
 * moved with the arrow keys. Used for the threshold charts, fuel use and reports (print-friendly: no canvas, no images).
 */
import { useCallback, useId, useRef, type KeyboardEvent, type PointerEvent } from "react";

export interface Series {
  label: string;
  points: [number, number][];
  kind: "dots" | "line";
  /** A CSS colour; defaults to the ink colour. */
  color?: string;
  dash?: boolean;
}

export interface Marker {
  id: string;
  label: string;
  x: number;
  color: string;
  /** Called with the data x under the pointer; the chart itself does not move the marker. */
  onMove?: (x: number) => void;
  /** Called with −1 or +1 when the marker has focus and an arrow key is pressed. */
  onStep?: (direction: -1 | 1) => void;
}

export interface ScatterChartProps {
  title: string;
  xLabel: string;
  yLabel: string;
  series: Series[];
  markers?: Marker[];
  height?: number;
  xFormat?: (v: number) => string;
  yFormat?: (v: number) => string;
}

const W = 640;
const PAD = { left: 64, right: 16, top: 16, bottom: 44 };

function niceTicks(min: number, max: number, count = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max) || min === max) return [min];
  const span = max - min;
  const step0 = span / count;
  const mag = 10 ** Math.floor(Math.log10(step0));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => span / s <= count) ?? 10 * mag;
  const ticks: number[] = [];
  for (let v = Math.ceil(min / step) * step; v <= max + 1e-9; v += step) ticks.push(Math.round(v * 1e6) / 1e6);
  return ticks;
}

function extent(values: number[]): [number, number] {
  let lo = Infinity,
    hi = -Infinity;
  for (const v of values) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!Number.isFinite(lo)) return [0, 1];
  const pad = (hi - lo) * 0.04 || 1;
  return [lo - pad, hi + pad];
}

export function ScatterChart({
  title,
  xLabel,
  yLabel,
  series,
  markers = [],
  height = 300,
  xFormat = String,
  yFormat = String,
}: ScatterChartProps) {
  const svgRef = useRef<SVGSVGElement>(null);
  const titleId = useId();
  const all = series.flatMap((s) => s.points);
  const [x0, x1] = extent(all.map((p) => p[0]));
  const [y0, y1] = extent(all.map((p) => p[1]));
  const H = height;
  const sx = (x: number) => PAD.left + ((x - x0) / (x1 - x0)) * (W - PAD.left - PAD.right);
  const sy = (y: number) => H - PAD.bottom - ((y - y0) / (y1 - y0)) * (H - PAD.top - PAD.bottom);
  const toDataX = useCallback(
    (clientX: number) => {
      const svg = svgRef.current;
      if (!svg) return null;
      const rect = svg.getBoundingClientRect();
      const px = ((clientX - rect.left) / rect.width) * W;
      return x0 + ((px - PAD.left) / (W - PAD.left - PAD.right)) * (x1 - x0);
    },
    [x0, x1],
  );
  const drag = (m: Marker) => ({
    onPointerDown: (e: PointerEvent<SVGGElement>) => {
      if (!m.onMove) return;
      (e.currentTarget as Element).setPointerCapture(e.pointerId);
      e.preventDefault();
    },
    onPointerMove: (e: PointerEvent<SVGGElement>) => {
      if (!m.onMove || !(e.currentTarget as Element).hasPointerCapture(e.pointerId)) return;
      const x = toDataX(e.clientX);
      if (x !== null) m.onMove(Math.max(x0, Math.min(x1, x)));
    },
    onKeyDown: (e: KeyboardEvent<SVGGElement>) => {
      if (!m.onStep) return;
      if (e.key === "ArrowLeft" || e.key === "ArrowDown") {
        e.preventDefault();
        m.onStep(-1);
      } else if (e.key === "ArrowRight" || e.key === "ArrowUp") {
        e.preventDefault();
        m.onStep(1);
      }
    },
  });
  return (
    <figure className="w-full">
      <figcaption id={titleId} className="mb-1 text-sm font-semibold">
        {title}
      </figcaption>
      <svg
        ref={svgRef}
        viewBox={`0 0 ${W} ${H}`}
        className="w-full touch-none select-none"
        // With markers that can be moved the chart is a group of controls, not a picture (an image holds no controls).
        role={markers.some((m) => m.onMove || m.onStep) ? "group" : "img"}
        aria-labelledby={titleId}
      >
        <rect
          x={PAD.left}
          y={PAD.top}
          width={W - PAD.left - PAD.right}
          height={H - PAD.top - PAD.bottom}
          fill="var(--color-paper)"
          stroke="var(--color-rule)"
        />
        {niceTicks(x0, x1).map((t) => (
          <g key={`x${t}`}>
            <line x1={sx(t)} x2={sx(t)} y1={PAD.top} y2={H - PAD.bottom} stroke="var(--color-rule)" strokeWidth={0.5} />
            <text x={sx(t)} y={H - PAD.bottom + 16} textAnchor="middle" fontSize={11} fill="var(--color-ink-soft)">
              {xFormat(t)}
            </text>
          </g>
        ))}
        {niceTicks(y0, y1).map((t) => (
          <g key={`y${t}`}>
            <line x1={PAD.left} x2={W - PAD.right} y1={sy(t)} y2={sy(t)} stroke="var(--color-rule)" strokeWidth={0.5} />
            <text x={PAD.left - 6} y={sy(t) + 4} textAnchor="end" fontSize={11} fill="var(--color-ink-soft)">
              {yFormat(t)}
            </text>
          </g>
        ))}
        <text x={(PAD.left + W - PAD.right) / 2} y={H - 6} textAnchor="middle" fontSize={12} fill="var(--color-ink)">
          {xLabel}
        </text>
        <text
          x={14}
          y={(PAD.top + H - PAD.bottom) / 2}
          textAnchor="middle"
          fontSize={12}
          fill="var(--color-ink)"
          transform={`rotate(-90 14 ${(PAD.top + H - PAD.bottom) / 2})`}
        >
          {yLabel}
        </text>
        {series.map((s) =>
          s.kind === "line" ? (
            <polyline
              key={s.label}
              fill="none"
              stroke={s.color ?? "var(--color-ink)"}
              strokeWidth={2}
              strokeDasharray={s.dash ? "6 4" : undefined}
              points={s.points.map(([x, y]) => `${sx(x).toFixed(1)},${sy(y).toFixed(1)}`).join(" ")}
            />
          ) : (
            <g key={s.label} fill={s.color ?? "var(--color-ink)"} fillOpacity={0.7}>
              {s.points.map(([x, y], i) => (
                <circle key={i} cx={sx(x)} cy={sy(y)} r={2.4} />
              ))}
            </g>
          ),
        )}
        {markers.map((m) => {
          const x = sx(Math.max(x0, Math.min(x1, m.x)));
          const interactive = !!m.onMove;
          return (
            <g
              key={m.id}
              {...drag(m)}
              tabIndex={interactive ? 0 : undefined}
              role={interactive ? "slider" : undefined}
              aria-label={interactive ? `${m.label} marker on ${title}: drag, or use the arrow keys` : undefined}
              aria-valuetext={interactive ? xFormat(m.x) : undefined}
              className={interactive ? "cursor-ew-resize" : undefined}
              data-marker={m.id}
            >
              <line x1={x} x2={x} y1={PAD.top} y2={H - PAD.bottom} stroke={m.color} strokeWidth={2.5} />
              {interactive ? (
                <rect x={x - 10} y={PAD.top} width={20} height={H - PAD.top - PAD.bottom} fill="transparent" />
              ) : null}
              <rect x={x - 22} y={PAD.top + 2} width={44} height={18} rx={4} fill={m.color} />
              <text x={x} y={PAD.top + 15} textAnchor="middle" fontSize={11} fontWeight={700} fill="#fff">
                {m.label}
              </text>
            </g>
          );
        })}
      </svg>
      <ul className="mt-1 flex flex-wrap gap-x-4 text-xs text-ink-soft">
        {series.map((s) => (
          <li key={s.label} className="flex items-center gap-1">
            <span
              aria-hidden
              className="inline-block h-2 w-3 rounded-sm"
              style={{ background: s.color ?? "var(--color-ink)" }}
            />
            {s.label}
          </li>
        ))}
      </ul>
    </figure>
  );
}
