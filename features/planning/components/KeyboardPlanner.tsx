"use client";
import { useState } from "react";
import { useHydrated } from "@/features/platform/components/use-hydrated";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import type { Repeat } from "../lib/repeat";
import { WEEKDAYS } from "../lib/weekdays";
import type { TrayTemplate } from "./PlanCalendar";

const WEEKDAY_LABELS: Record<(typeof WEEKDAYS)[number], string> = {
  MO: "Mon",
  TU: "Tue",
  WE: "Wed",
  TH: "Thu",
  FR: "Fri",
  SA: "Sat",
  SU: "Sun",
};

/** Planning without a pointer: choose a template and a day, and optionally repeat it weekly (an RRULE). */
export function KeyboardPlanner({
  templates,
  defaultDate,
  initialTemplateId,
  onPlan,
}: {
  templates: TrayTemplate[];
  defaultDate: string;
  /** A template chosen on the tray with the keyboard. */
  initialTemplateId?: string;
  onPlan: (templateId: string, date: string, repeat?: Repeat) => void;
}) {
  const [templateId, setTemplateId] = useState(initialTemplateId ?? "");
  const [date, setDate] = useState(defaultDate);
  const [repeats, setRepeats] = useState(false);
  const [days, setDays] = useState<(typeof WEEKDAYS)[number][]>([]);
  const [endBy, setEndBy] = useState<"count" | "until">("count");
  const [count, setCount] = useState(8);
  const [until, setUntil] = useState("");
  const [problem, setProblem] = useState("");
  const hydrated = useHydrated();
  if (!templates.length) return null;
  return (
    <form
      className="mt-2 max-w-md space-y-2 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        setProblem("");
        if (!templateId || !date) return;
        if (!repeats) return onPlan(templateId, date);
        if (!days.length) return setProblem("Choose at least one weekday to repeat on.");
        if (endBy === "until" && !until)
          return setProblem("Give the last date of the repeat, or a number of sessions.");
        if (endBy === "count" && !(count >= 1 && count <= 104)) return setProblem("Repeat between 1 and 104 times.");
        onPlan(templateId, date, endBy === "count" ? { byWeekday: days, count } : { byWeekday: days, until });
      }}
    >
      <fieldset disabled={!hydrated} className="space-y-2">
        <div>
          <label htmlFor="kp-template" className="field-label">
            Template
          </label>
          <select
            id="kp-template"
            className="field-input"
            value={templateId}
            onChange={(e) => setTemplateId(e.target.value)}
          >
            <option value="">Choose…</option>
            {templates.map((t) => (
              <option key={t.id} value={t.id}>
                {t.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="kp-day" className="field-label">
            Day
          </label>
          <input
            id="kp-day"
            type="date"
            className="field-input num"
            value={date}
            onChange={(e) => setDate(e.target.value)}
          />
        </div>
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={repeats} onChange={(e) => setRepeats(e.target.checked)} /> Repeat weekly
        </label>
        {repeats ? (
          <div className="space-y-2 border-l-2 border-rule pl-2">
            <fieldset>
              <legend className="field-label">On</legend>
              <div className="flex flex-wrap gap-x-2">
                {WEEKDAYS.map((d) => (
                  <label key={d} className="flex items-center gap-1">
                    <input
                      type="checkbox"
                      checked={days.includes(d)}
                      onChange={(e) => setDays((x) => (e.target.checked ? [...x, d] : x.filter((y) => y !== d)))}
                    />
                    {WEEKDAY_LABELS[d]}
                  </label>
                ))}
              </div>
            </fieldset>
            <fieldset className="space-y-1">
              <legend className="field-label">Ends</legend>
              <label className="flex items-center gap-1">
                <input type="radio" checked={endBy === "count"} onChange={() => setEndBy("count")} /> after
                <input
                  aria-label="Number of sessions"
                  type="number"
                  min={1}
                  max={104}
                  className="field-input mt-0 w-16 num"
                  value={count}
                  onChange={(e) => setCount(Number(e.target.value))}
                />{" "}
                sessions
              </label>
              <label className="flex items-center gap-1">
                <input type="radio" checked={endBy === "until"} onChange={() => setEndBy("until")} /> on
                <input
                  aria-label="Last date"
                  type="date"
                  className="field-input mt-0 num"
                  value={until}
                  onChange={(e) => setUntil(e.target.value)}
                />
              </label>
            </fieldset>
          </div>
        ) : null}
        {problem ? (
          <p role="alert" className="text-alert">
            {problem}
          </p>
        ) : null}
        <SubmitButton className="btn w-full" disabled={!templateId || !date}>
          {repeats ? "Plan the series" : "Plan it"}
        </SubmitButton>
      </fieldset>
    </form>
  );
}
