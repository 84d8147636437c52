"use client";
import { useDates } from "@/features/platform/components/dates";
import type { Fix, WeekSummary } from "../lib/weeks";

const ZONE_BG = ["bg-zone-1", "bg-zone-2", "bg-zone-3"];
/** Zone segments are outlined in ink: zone 1's light fill alone is too close to the track (WCAG 2.2, 1.4.11; the ratios
 * are checked in zone-colours.test.ts). */
const SEGMENT = "border-r border-ink last:border-r-0";

/** A week's planned minutes per zone as a stacked bar against the budget's shares, with its state and reasons. */
export function BudgetBand({
  week,
  preview,
  onApplyFix,
  busy,
}: {
  week: WeekSummary;
  preview?: boolean;
  onApplyFix?: (fix: Fix) => void;
  busy?: boolean;
}) {
  const total = week.plannedMinByZone.reduce((a, b) => a + b, 0);
  const done = week.doneMinByZone.reduce((a, b) => a + b, 0);
  const scale = Math.max(total, done);
  const dates = useDates();
  const label = `Week of ${dates.day(week.weekStart)}`;
  return (
    <section
      aria-label={`Budget, ${label}`}
      data-testid={`${preview ? "preview" : "band"}-${week.weekStart}`}
      data-over={week.overBudget ? "yes" : "no"}
      className={`rounded-md border px-3 py-2 ${week.overBudget ? "border-alert/60 bg-alert-wash/50" : "border-rule bg-paper"} ${preview ? "ring-2 ring-tide" : ""}`}
    >
      <div className="flex flex-wrap items-baseline justify-between gap-2 text-sm">
        <p className="font-semibold">
          {label}
          {week.block ? <span className="font-normal text-ink-soft"> · {week.block.replaceAll("_", " ")}</span> : null}
          {week.role === "taper" || week.role === "event" ? (
            <span className="font-normal text-ink-soft">
              {" "}
              · {week.role === "taper" ? "taper" : "race week"}: intensity kept, judged on volume
            </span>
          ) : null}
          {week.rebuild ? (
            <span className="font-normal text-ink-soft">
              {" "}
              · back after a break: week {week.rebuild.week} of {week.rebuild.of}, at most {week.rebuild.limitMin} min
            </span>
          ) : null}
          {preview ? <span className="ml-2 text-tide">preview of the drop</span> : null}
        </p>
        <p className="num text-ink-soft">
          {Math.round(total)} min planned · zone 1 {Math.round(week.plannedMinByZone[0])} · zone 2{" "}
          {Math.round(week.plannedMinByZone[1])} · zone 3 {Math.round(week.plannedMinByZone[2])} min ·{" "}
          <span title={week.budget.source}>
            {week.budget.name} budget {week.budget.shares.map((s) => Math.round(s * 100)).join("/")} % ±{" "}
            {Math.round(week.budget.tolerance * 100)},{" "}
            {week.budget.counting === "session" ? "counted by session" : "counted by time"}
          </span>
        </p>
      </div>
      <div
        className="relative mt-1 h-4 overflow-hidden rounded border border-ink bg-ground"
        role="img"
        aria-label={`${label}: ${week.plannedMinByZone.map((m, i) => `zone ${i + 1} ${total ? Math.round((100 * m) / total) : 0} %`).join(", ")}`}
      >
        <div className="flex h-full">
          {week.plannedMinByZone.map((m, i) =>
            total && m > 0 ? (
              <div key={i} className={`${ZONE_BG[i]} ${SEGMENT}`} style={{ width: `${(100 * m) / total}%` }} />
            ) : null,
          )}
        </div>
        {/* Budget targets: where zone 1 should end and zone 3 should start. */}
        <div
          className="absolute inset-y-0 border-l-2 border-dashed border-ink"
          style={{ left: `${week.budget.shares[0] * 100}%` }}
          title="Budget: end of zone 1"
        />
        <div
          className="absolute inset-y-0 border-l-2 border-dashed border-ink/60"
          style={{ left: `${(1 - week.budget.shares[2]) * 100}%` }}
          title="Budget: start of zone 3"
        />
      </div>
      {done > 0 || total > 0 ? (
        <div className="mt-1 flex items-center gap-2 text-xs">
          <span className="w-24 shrink-0 font-semibold">
            Done <span className="num">{Math.round(done)} min</span>
          </span>
          <div
            className="flex h-2 flex-1 overflow-hidden rounded border border-ink bg-ground"
            role="img"
            aria-label={`Done so far: ${week.doneMinByZone.map((m, i) => `zone ${i + 1} ${Math.round(m)} min`).join(", ")} of ${Math.round(total)} planned minutes`}
          >
            {week.doneMinByZone.map((m, i) =>
              scale ? (
                m > 0 ? (
                  <div
                    key={i}
                    className={`${ZONE_BG[i]} border-r border-ink`}
                    style={{ width: `${(100 * m) / scale}%` }}
                  />
                ) : null
              ) : null,
            )}
          </div>
          <span className="num shrink-0 text-ink-soft">{total ? Math.round((100 * done) / total) : 0} % of plan</span>
        </div>
      ) : null}
      {week.inProgress && week.targetMin ? (
        <p className="mt-1 text-sm font-semibold text-ink-soft" data-testid="in-progress">
          In progress: {Math.round(total)} of {week.targetMin} min planned. The budget is judged once half the target is
          planned or the week begins.
        </p>
      ) : null}
      {week.flags.length ? (
        <ul className={`mt-1 space-y-0.5 text-sm ${week.inProgress ? "text-ink-soft" : ""}`}>
          {week.overBudget ? <li className="font-semibold text-alert">Over budget</li> : null}
          {week.flags.map((f) => (
            <li key={f.code} data-flag={f.code}>
              {dates.text(f.message)}
            </li>
          ))}
        </ul>
      ) : total ? (
        <p className="mt-1 text-sm text-ink-soft">Within budget.</p>
      ) : (
        <p className="mt-1 text-sm text-ink-soft">Nothing planned yet.</p>
      )}
      {week.fixes.length && onApplyFix && !preview ? (
        <ul className="mt-1 space-y-1 text-sm" aria-label="Suggested fixes">
          {week.fixes.map((fix, i) => (
            <li key={`${fix.action}-${i}`} className="flex flex-wrap items-center gap-2">
              <span>
                {i === 0 ? "Suggested fix" : "Or"}: {dates.text(fix.message)}
              </span>
              <button type="button" className="btn-quiet py-1" onClick={() => onApplyFix(fix)} disabled={busy}>
                {i === 0 ? "Apply the fix" : "Apply this one instead"}
              </button>
            </li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}
