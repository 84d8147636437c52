"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useDates } from "@/features/platform/components/dates";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { apiFetch, ApiError } from "@/features/platform/lib/api-client";
import { addDays } from "@/features/platform/lib/days";
import { SPORT_LABELS, type Sport } from "@/features/platform/lib/sports";
import type { WeekSummary } from "../lib/weeks";

interface Answer {
  preview: boolean;
  created: number;
  athletes: {
    athleteId: string;
    name: string;
    sessions: number;
    weeks: { weekStart: string; before: WeekSummary; after: WeekSummary }[];
  }[];
}

/**
 * Plan for several athletes of a squad at once: a template on one day, or one athlete's week copied into this or later
 * weeks. "Show each athlete's week" previews every athlete's budget after it without writing; "Plan it" writes it in one
 * action. Each session's targets come from each athlete's own zones.
 */
export function GroupPlanner({
  squadId,
  monday,
  athletes,
  templates,
}: {
  squadId: string;
  monday: string;
  athletes: { id: string; name: string; sports: string[] }[];
  templates: { id: string; name: string; sport: string }[];
}) {
  const router = useRouter();
  const dates = useDates();
  const [mode, setMode] = useState<"template" | "week">("template");
  const [templateId, setTemplateId] = useState(templates[0]?.id ?? "");
  const [date, setDate] = useState(monday);
  const [source, setSource] = useState(athletes[0]?.id ?? "");
  const [targets, setTargets] = useState<string[]>([addDays(monday, 7)]);
  const [chosen, setChosen] = useState<string[]>([]);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const days = Array.from({ length: 7 }, (_, i) => addDays(monday, i));
  const weeks = Array.from({ length: 9 }, (_, i) => addDays(monday, 7 * i));

  const body = (preview: boolean) =>
    mode === "template"
      ? { mode, templateId, date, athleteIds: chosen, preview }
      : { mode, sourceAthleteId: source, sourceWeek: monday, targetWeeks: targets, athleteIds: chosen, preview };

  async function send(preview: boolean) {
    setError(null);
    setBusy(true);
    try {
      const a = await apiFetch<Answer>(`/api/squads/${squadId}/plan`, {
        method: "POST",
        body: JSON.stringify(body(preview)),
      });
      setAnswer(a);
      if (!preview) router.refresh();
    } catch (e) {
      setAnswer(null);
      if (e instanceof ApiError) {
        const first = Object.values(e.fieldErrors)[0]?.[0];
        setError(first ? `${e.message} ${first}` : e.message);
      } else setError("Planning failed.");
    } finally {
      setBusy(false);
    }
  }

  const template = templates.find((t) => t.id === templateId);
  // A template of another sport than an athlete trains is named before it is planned (the preview is the question).
  const otherSport =
    mode === "template" && template
      ? athletes.filter((a) => chosen.includes(a.id) && a.sports.length > 0 && !a.sports.includes(template.sport))
      : [];
  const sportName = (s: string) => SPORT_LABELS[s as Sport]?.toLowerCase() ?? s;

  const toggle = (list: string[], v: string) => (list.includes(v) ? list.filter((x) => x !== v) : [...list, v]);
  const reset = () => setAnswer(null);

  return (
    <section className="card space-y-4" aria-labelledby="group-planner-title">
      <h2 id="group-planner-title" className="text-lg font-bold">
        Plan for several athletes
      </h2>
      <fieldset className="flex flex-wrap gap-x-6 gap-y-2 text-sm">
        <legend className="field-label">What to plan</legend>
        <label className="flex items-center gap-2">
          <input
            type="radio"
            name="group-mode"
            checked={mode === "template"}
            onChange={() => {
              setMode("template");
              reset();
            }}
          />
          A template on one day
        </label>
        <label className="flex items-center gap-2">
          <input
            type="radio"
            name="group-mode"
            checked={mode === "week"}
            onChange={() => {
              setMode("week");
              reset();
            }}
          />
          One athlete&apos;s week of {dates.day(monday)}
        </label>
      </fieldset>
      {mode === "template" ? (
        <div className="grid gap-4 sm:grid-cols-2">
          <div>
            <label htmlFor="group-template" className="field-label">
              Template
            </label>
            <select
              id="group-template"
              className="field-input"
              value={templateId}
              onChange={(e) => {
                setTemplateId(e.target.value);
                reset();
              }}
            >
              {templates.map((t) => (
                <option key={t.id} value={t.id}>
                  {t.name} ({SPORT_LABELS[t.sport as Sport] ?? t.sport})
                </option>
              ))}
            </select>
          </div>
          <div>
            <label htmlFor="group-day" className="field-label">
              Day
            </label>
            <select
              id="group-day"
              className="field-input"
              value={date}
              onChange={(e) => {
                setDate(e.target.value);
                reset();
              }}
            >
              {days.map((d) => (
                <option key={d} value={d}>
                  {dates.day(d, { weekday: true })}
                </option>
              ))}
            </select>
          </div>
        </div>
      ) : (
        <div className="grid gap-4 sm:grid-cols-2">
          <div>
            <label htmlFor="group-source" className="field-label">
              Copy the training sessions of
            </label>
            <select
              id="group-source"
              className="field-input"
              value={source}
              onChange={(e) => {
                setSource(e.target.value);
                reset();
              }}
            >
              {athletes.map((a) => (
                <option key={a.id} value={a.id}>
                  {a.name}, week of {dates.day(monday)}
                </option>
              ))}
            </select>
          </div>
          <fieldset>
            <legend className="field-label">Into the weeks of</legend>
            <div className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
              {weeks.map((w) => (
                <label key={w} className="num flex items-center gap-1.5">
                  <input
                    type="checkbox"
                    checked={targets.includes(w)}
                    onChange={() => {
                      setTargets(toggle(targets, w));
                      reset();
                    }}
                  />
                  {dates.day(w)}
                </label>
              ))}
            </div>
          </fieldset>
        </div>
      )}
      <fieldset>
        <legend className="field-label">For these athletes</legend>
        <div className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
          <label className="flex items-center gap-2 font-semibold">
            <input
              type="checkbox"
              checked={chosen.length === athletes.length && athletes.length > 0}
              onChange={() => {
                setChosen(chosen.length === athletes.length ? [] : athletes.map((a) => a.id));
                reset();
              }}
            />
            All {athletes.length}
          </label>
          {athletes.map((a) => (
            <label key={a.id} className="flex items-center gap-2">
              <input
                type="checkbox"
                checked={chosen.includes(a.id)}
                onChange={() => {
                  setChosen(toggle(chosen, a.id));
                  reset();
                }}
              />
              {a.name}
            </label>
          ))}
        </div>
      </fieldset>
      <FormAlert>{error}</FormAlert>
      <div className="flex flex-wrap gap-3">
        <button type="button" className="btn-quiet" disabled={busy} onClick={() => send(true)}>
          Show each athlete&apos;s week
        </button>
        <button type="button" className="btn" disabled={busy || !answer?.preview} onClick={() => send(false)}>
          {answer?.preview
            ? `Plan it for ${answer.athletes.length} athlete${answer.athletes.length === 1 ? "" : "s"}`
            : "Plan it (after the preview)"}
        </button>
      </div>
      {answer?.preview && otherSport.length > 0 ? (
        <p
          role="alert"
          className="rounded-md border border-alert/60 bg-alert-wash/50 p-3 text-sm"
          data-testid="other-sport"
        >
          &quot;{template!.name}&quot; is a {sportName(template!.sport)} template, and{" "}
          {otherSport.map((a) => `${a.name} trains ${a.sports.map(sportName).join(", ")}`).join("; ")}. &quot;Plan
          it&quot; plans it for them too; untick them to leave them out.
        </p>
      ) : null}
      {answer && !answer.preview ? (
        <FormNotice>
          Planned {answer.created} session{answer.created === 1 ? "" : "s"} for {answer.athletes.length} athlete
          {answer.athletes.length === 1 ? "" : "s"}.
        </FormNotice>
      ) : null}
      {answer ? (
        <table className="w-full text-sm" data-testid="group-preview">
          <caption className="mb-1 text-left text-ink-soft">
            {answer.preview
              ? "Each athlete's week if this is planned (nothing is written yet)"
              : "Each athlete's week now"}
          </caption>
          <thead>
            <tr className="text-left text-ink-soft">
              <th scope="col" className="py-1 pr-3">
                Athlete
              </th>
              <th scope="col" className="py-1 pr-3">
                Week
              </th>
              <th scope="col" className="py-1 pr-3">
                Planned after
              </th>
              <th scope="col" className="py-1">
                Budget after
              </th>
            </tr>
          </thead>
          <tbody>
            {answer.athletes.flatMap((a) =>
              a.weeks.map((w) => {
                const m = w.after.plannedMinByZone;
                const total = Math.round(m[0] + m[1] + m[2]);
                return (
                  <tr key={`${a.athleteId}-${w.weekStart}`} className="border-t border-rule align-top">
                    <th scope="row" className="py-1 pr-3 text-left font-semibold">
                      {a.name}
                    </th>
                    <td className="num py-1 pr-3">{dates.day(w.weekStart)}</td>
                    <td className="num py-1 pr-3">
                      {total} min (z1 {Math.round(m[0])} · z2 {Math.round(m[1])} · z3 {Math.round(m[2])})
                    </td>
                    <td className="py-1">
                      {w.after.overBudget ? (
                        <span className="font-semibold text-alert">
                          Over budget: {dates.text(w.after.flags[0]?.message ?? "")}
                        </span>
                      ) : w.after.inProgress ? (
                        <span className="text-ink-soft">In progress (under half its target)</span>
                      ) : (
                        <span>Within budget</span>
                      )}
                    </td>
                  </tr>
                );
              }),
            )}
          </tbody>
        </table>
      ) : null}
    </section>
  );
}
