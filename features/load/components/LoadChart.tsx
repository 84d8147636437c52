import { formatDay, type DateStyle } from "@/features/platform/lib/date-format";
import type { LoadReport } from "../lib/report";
import { ACWR_SAFE_BAND } from "../lib/load";

const ZONE_FILL = ["var(--color-zone-1)", "var(--color-zone-2)", "var(--color-zone-3)"];

/**
 * Weekly load over the season: the session-RPE load of each week as a column (arbitrary units) over the week's time per zone
 * as a stacked column (minutes), with monotony under each week. Our own design; every number is labelled with its unit.
 */
export function LoadChart({ report, dateStyle = "iso" }: { report: LoadReport; dateStyle?: DateStyle }) {
  const weeks = report.weeks;
  const W = 720,
    colW = W / Math.max(1, weeks.length),
    loadH = 110,
    zoneH = 90,
    gap = 28;
  const maxLoad = Math.max(1, ...weeks.map((w) => w.load));
  const maxMin = Math.max(1, ...weeks.map((w) => w.minByZone[0] + w.minByZone[1] + w.minByZone[2]));
  const ratio = report.latest.acwrEwma ?? report.latest.acwrRolling;
  return (
    <figure className="space-y-2">
      <svg
        viewBox={`0 0 ${W} ${loadH + zoneH + gap + 40}`}
        className="w-full"
        role="img"
        aria-label={`Weekly load and time per zone, ${weeks.length} weeks`}
      >
        <text x={0} y={10} fontSize={11} fill="var(--color-ink-soft)">
          Session-RPE load per week (AU), top · time per zone (min), bottom
        </text>
        {weeks.map((w, i) => {
          const x = i * colW + colW * 0.15,
            bw = colW * 0.7;
          const h = (w.load / maxLoad) * (loadH - 24);
          const total = w.minByZone[0] + w.minByZone[1] + w.minByZone[2];
          let y = loadH + gap + zoneH;
          return (
            <g key={w.weekStart}>
              <title>{`Week of ${formatDay(w.weekStart, dateStyle)}: load ${Math.round(w.load)} AU, ${Math.round(total)} min (zone 1 ${Math.round(w.minByZone[0])}, zone 2 ${Math.round(w.minByZone[1])}, zone 3 ${Math.round(w.minByZone[2])} min)`}</title>
              <rect x={x} y={loadH - h} width={bw} height={h} fill="var(--color-tide)" rx={2} />
              {w.load > 0 ? (
                <text x={x + bw / 2} y={loadH - h - 3} fontSize={10} textAnchor="middle" fill="var(--color-ink)">
                  {Math.round(w.load)} AU
                </text>
              ) : null}
              {w.minByZone.map((m, z) => {
                const zh = (m / maxMin) * zoneH;
                y -= zh;
                return <rect key={z} x={x} y={y} width={bw} height={zh} fill={ZONE_FILL[z]} />;
              })}
              {total > 0 ? (
                <text x={x + bw / 2} y={y - 3} fontSize={10} textAnchor="middle" fill="var(--color-ink)">
                  {Math.round(total)} min
                </text>
              ) : null}
              <text
                x={x + bw / 2}
                y={loadH + gap + zoneH + 14}
                fontSize={10}
                textAnchor="middle"
                fill="var(--color-ink-soft)"
              >
                {formatDay(w.weekStart, dateStyle, { year: false })}
              </text>
              <text
                x={x + bw / 2}
                y={loadH + gap + zoneH + 28}
                fontSize={9}
                textAnchor="middle"
                fill="var(--color-ink-soft)"
              >
                {w.monotony !== null ? `mono ${w.monotony.toFixed(1)}` : ""}
              </text>
            </g>
          );
        })}
        <line x1={0} x2={W} y1={loadH} y2={loadH} stroke="var(--color-rule)" />
        <line x1={0} x2={W} y1={loadH + gap + zoneH} y2={loadH + gap + zoneH} stroke="var(--color-rule)" />
      </svg>
      <figcaption className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
        <span className="flex items-center gap-1">
          <span aria-hidden className="inline-block h-3 w-3 rounded-sm bg-tide" /> load (RPE × minutes, AU)
        </span>
        {[1, 2, 3].map((z) => (
          <span key={z} className="flex items-center gap-1">
            <span aria-hidden className={`inline-block h-3 w-3 rounded-sm bg-zone-${z}`} /> zone {z} minutes
          </span>
        ))}
        <span className="num" data-testid="acwr">
          Acute:chronic ratio today:{" "}
          {ratio === null
            ? "not enough history yet (it needs at least three of the last four weeks)"
            : ratio.toFixed(2)}
          {report.latest.flag ? (
            <strong className="text-alert">
              {" "}
              — {report.latest.flag === "high" ? "above" : "below"} the commonly used {ACWR_SAFE_BAND[0]}–
              {ACWR_SAFE_BAND[1]} band
            </strong>
          ) : ratio !== null ? (
            ` (within ${ACWR_SAFE_BAND[0]}–${ACWR_SAFE_BAND[1]})`
          ) : (
            ""
          )}
        </span>
        {report.unratedLogs ? (
          <span className="text-ink-soft">{report.unratedLogs} log(s) without an RPE are not in the load.</span>
        ) : null}
      </figcaption>
    </figure>
  );
}
