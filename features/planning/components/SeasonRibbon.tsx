"use client";
import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useDates } from "@/features/platform/components/dates";
import { planQueries } from "../api";
import { BLOCK_LABELS, BLOCK_SHORT, type BlockName, type SeasonWeek } from "../lib/season";
import type { WeekSummary } from "../lib/weeks";

/** The blocks' own palette (app/globals.css), apart from the zone colours; the competition block is dark with white text. */
const BLOCK_STYLE: Record<BlockName, string> = {
  general_preparation: "bg-block-general",
  specific_preparation: "bg-block-specific",
  pre_competition: "bg-block-pre",
  taper: "bg-block-taper border-dashed",
  competition: "bg-block-competition text-white",
  transition: "bg-block-transition",
};

/**
 * The strip of a season's weeks: block, volume target, budget state and retest marks; a week opens in the calendar. The
 * budget state is the planner's own weeks query over the season (the server's answer to start with), so a change made in
 * the calendar marks and clears the ribbon's weeks together with the band.
 */
export function SeasonRibbon({
  athleteId,
  name,
  weeks,
  initialSummaries,
}: {
  athleteId: string;
  name: string;
  weeks: SeasonWeek[];
  initialSummaries: WeekSummary[];
}) {
  const dates = useDates();
  const first = weeks[0]?.weekStart ?? "",
    last = weeks.at(-1)?.weekStart ?? "";
  const summaries = useQuery({
    ...planQueries.weeks(athleteId, first, last),
    initialData: initialSummaries,
    staleTime: 30_000,
  }).data;
  const overBudget: Record<string, string[]> = {};
  for (const s of summaries ?? []) if (s.overBudget) overBudget[s.weekStart] = s.flags.map((f) => f.message);
  const blocks = [...new Set(weeks.map((w) => w.block))];
  return (
    <section aria-label={`Season ribbon: ${name}`} className="space-y-2">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="font-bold">{name}</h2>
        <ul className="flex flex-wrap gap-3 text-xs">
          {blocks.map((b) => (
            <li key={b} className="flex items-center gap-1">
              <span aria-hidden className={`inline-block h-3 w-3 rounded-sm border border-rule ${BLOCK_STYLE[b]}`} />
              {BLOCK_LABELS[b]}
              <span className="text-ink-soft">({BLOCK_SHORT[b]})</span>
            </li>
          ))}
          <li>⟳ retest</li>
          <li>
            <span className="font-bold text-alert">!</span> over budget
          </li>
        </ul>
      </div>
      <ol className="flex gap-0.5 overflow-x-auto pb-1">
        {weeks.map((w) => {
          const flags = overBudget[w.weekStart] ?? [];
          return (
            <li key={w.weekStart} className="min-w-14 flex-1">
              <Link
                href={`/athletes/${athleteId}/plan?week=${w.weekStart}`}
                // A season holds up to 52 of these: fetched when followed, not all ahead in the background.
                prefetch={false}
                className={`relative block rounded border px-1 py-1 text-center text-[11px] leading-tight ${BLOCK_STYLE[w.block]} ${flags.length ? "border-alert" : "border-rule"}`}
                title={dates.text(
                  `Week of ${w.weekStart}: ${BLOCK_LABELS[w.block]}, ${w.role}, ${w.volumeHours} h target${w.retest ? `, retest${w.retestNote ? ` (${w.retestNote})` : ""}` : ""}${w.events.length ? `, ${w.events.join(", ")}` : ""}${flags.length ? ` — ${flags.join("; ")}` : ""}`,
                )}
              >
                {/* The block's name as well as its colour (colour is never the only cue). */}
                <span aria-hidden className="block">
                  {BLOCK_SHORT[w.block]}
                </span>
                <span className="block num">{dates.day(w.weekStart, { year: false })}</span>
                <span className="block whitespace-nowrap num font-semibold">
                  {w.volumeHours} h{w.retest ? " ⟳" : ""}
                  {flags.length ? <span className="font-bold text-alert"> !</span> : null}
                </span>
                <span className="sr-only">
                  : week of {dates.day(w.weekStart)}, {BLOCK_LABELS[w.block]}
                  {w.retest ? ", retest" : ""}
                  {flags.length ? ", over budget" : ""}
                </span>
              </Link>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
