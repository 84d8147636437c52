"use client";
import { useState } from "react";
import { useDates } from "@/features/platform/components/dates";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { apiFetch, ApiError } from "@/features/platform/lib/api-client";
import { addDays } from "@/features/platform/lib/days";
import type { WeekSummary } from "../lib/weeks";

interface Answer {
  preview: boolean;
  created: number;
  athletes: { weeks: { weekStart: string; after: WeekSummary }[] }[];
}

/**
 * Copy a week's training sessions into the following weeks of the same athlete: first each target week as it would be
 * (nothing written), then the copy in one action. Retests are not copied.
 */
export function CopyWeek({
  athleteId,
  weekStarts,
  onCopied,
}: {
  athleteId: string;
  weekStarts: string[];
  onCopied: () => Promise<unknown> | void;
}) {
  const dates = useDates();
  const [week, setWeek] = useState(weekStarts[0] ?? "");
  const [count, setCount] = useState(1);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const source = weekStarts.includes(week) ? week : (weekStarts[0] ?? "");
  const targets = Array.from({ length: count }, (_, i) => addDays(source, 7 * (i + 1)));

  async function send(preview: boolean) {
    setBusy(true);
    setError(null);
    try {
      const a = await apiFetch<Answer>(`/api/athletes/${athleteId}/weeks/${source}/copy`, {
        method: "POST",
        body: JSON.stringify({ targetWeeks: targets, preview }),
      });
      setAnswer(a);
      if (!preview) await onCopied();
    } catch (e) {
      setAnswer(null);
      setError(e instanceof ApiError ? e.message : "Copying failed.");
    } finally {
      setBusy(false);
    }
  }

  if (!source) return null;
  return (
    <details className="rounded-md border border-rule bg-paper px-4 py-2 text-sm">
      <summary className="cursor-pointer font-semibold">Copy a week into the next weeks</summary>
      <div className="mt-3 flex flex-wrap items-end gap-3">
        <div>
          <label htmlFor="copy-week" className="field-label">
            Copy the training sessions of the week of
          </label>
          <select
            id="copy-week"
            className="field-input num"
            value={source}
            onChange={(e) => {
              setWeek(e.target.value);
              setAnswer(null);
            }}
          >
            {weekStarts.map((w) => (
              <option key={w} value={w}>
                {dates.day(w)}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="copy-count" className="field-label">
            Into
          </label>
          <select
            id="copy-count"
            className="field-input"
            value={count}
            onChange={(e) => {
              setCount(Number(e.target.value));
              setAnswer(null);
            }}
          >
            {[1, 2, 3, 4, 5, 6, 7, 8].map((n) => (
              <option key={n} value={n}>
                the next {n === 1 ? "week" : `${n} weeks`}
              </option>
            ))}
          </select>
        </div>
        <button type="button" className="btn-quiet" disabled={busy} onClick={() => send(true)}>
          Show those weeks after it
        </button>
        <button type="button" className="btn" disabled={busy || !answer?.preview} onClick={() => send(false)}>
          Copy it
        </button>
      </div>
      <div className="mt-3 space-y-2">
        <FormAlert>{error}</FormAlert>
        {answer && !answer.preview ? (
          <FormNotice>
            Copied {answer.created} session{answer.created === 1 ? "" : "s"} into {count} week{count === 1 ? "" : "s"}.
          </FormNotice>
        ) : null}
        {answer?.preview ? (
          <ul className="space-y-1" data-testid="copy-preview">
            {(answer.athletes[0]?.weeks ?? []).map((w) => {
              const m = w.after.plannedMinByZone;
              return (
                <li key={w.weekStart} className="num">
                  Week of {dates.day(w.weekStart)}: {Math.round(m[0] + m[1] + m[2])} min planned ·{" "}
                  {w.after.overBudget ? (
                    <span className="font-semibold text-alert">
                      over budget: {dates.text(w.after.flags[0]?.message ?? "")}
                    </span>
                  ) : w.after.inProgress ? (
                    "in progress (under half its target)"
                  ) : (
                    "within budget"
                  )}
                </li>
              );
            })}
          </ul>
        ) : null}
      </div>
    </details>
  );
}
