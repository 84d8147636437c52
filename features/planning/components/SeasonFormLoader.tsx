"use client";
import dynamic from "next/dynamic";

/**
 * The season form with its validation libraries loads only on the page of an athlete without a season, so that the
 * planner's first load stays light for everyone else.
 */
export const SeasonFormLoader = dynamic(() => import("./SeasonForm").then((m) => m.SeasonForm), {
  ssr: false,
  loading: () => (
    <p role="status" className="text-sm text-ink-soft">
      Loading the season form…
    </p>
  ),
});
