"use client";
import dynamic from "next/dynamic";
import dayGridPlugin from "@fullcalendar/daygrid";
import interactionPlugin, { Draggable } from "@fullcalendar/interaction";
import FullCalendar from "@fullcalendar/react";
import type { DatesSetArg, EventClickArg, EventDropArg, EventInput } from "@fullcalendar/core";
import type { EventReceiveArg } from "@fullcalendar/interaction";
import { useEffect, useMemo, useRef, useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { useHydrated } from "@/features/platform/components/use-hydrated";
import { useQueryClient } from "@tanstack/react-query";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { invalidatePlan, useCreateSession, useDeleteSession, useMoveSession, useSessions, useWeeks, type SessionDto } from "../api";
import { BUDGET_PRESETS, type BudgetPreset } from "../lib/budget";
import { mondayOf } from "@/features/platform/lib/days";
import { summariseWeeks, type SeasonWeekInfo, type WeekSession, type WeekSummary } from "../lib/weeks";
import { addDays } from "@/features/platform/lib/days";
import { BudgetBand } from "./BudgetBand";
import type { Repeat } from "../lib/repeat";
import { WEEKDAYS } from "../lib/weekdays";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

// The editor brings the form and validation libraries; it loads when a coach first opens it, not with the calendar.
const SessionEditor = dynamic(() => import("./SessionEditor").then((m) => m.SessionEditor), { ssr: false, loading: () => <p role="status" className="text-sm text-ink-soft">Opening the editor…</p> });

export interface TrayTemplate {
  id: string;
  name: string;
  sport: string;
  totalS: number;
  minutesByZone: [number, number, number];
}

const presetOf = (name: string): BudgetPreset => (Object.entries(BUDGET_PRESETS).find(([, b]) => b.name === name)?.[0] as BudgetPreset) ?? "polarised";

const LOG_MARK = { done: "✓", partial: "◐", skipped: "✗" } as const;
const LOG_WORD = { done: "done", partial: "partly done", skipped: "skipped" } as const;

function zoneText(m: [number, number, number]) {
  return `z1 ${Math.round(m[0])} · z2 ${Math.round(m[1])} · z3 ${Math.round(m[2])} min`;
}

export function PlanCalendar({ athleteId, templates, initialDate, canEdit }: { athleteId: string; templates: TrayTemplate[]; initialDate: string; canEdit: boolean }) {
  const calendarRef = useRef<FullCalendar>(null);
  const trayRef = useRef<HTMLUListElement>(null);
  const [range, setRange] = useState<{ from: string; to: string }>({ from: "", to: "" });
  const [message, setMessage] = useState<{ kind: "ok" | "error"; text: string }>();
  const [preview, setPreview] = useState<WeekSummary | null>(null);
  const [selected, setSelected] = useState<SessionDto | null>(null);
  const [scope, setScope] = useState<"one" | "series">("one");
  const [editing, setEditing] = useState(false);
  const sessions = useSessions(athleteId, range.from, range.to);
  const weeks = useWeeks(athleteId, range.from, range.to);
  const move = useMoveSession(athleteId, range.from, range.to);
  const create = useCreateSession(athleteId);
  const remove = useDeleteSession(athleteId);

  // A week chosen on the season ribbon arrives as a new initial date while the calendar stays mounted.
  useEffect(() => {
    calendarRef.current?.getApi().gotoDate(initialDate);
  }, [initialDate]);

  // An external drag can end anywhere; the preview ends with it.
  useEffect(() => {
    const clear = () => setTimeout(() => setPreview(null), 0);
    document.addEventListener("pointerup", clear);
    document.addEventListener("mouseup", clear);
    return () => {
      document.removeEventListener("pointerup", clear);
      document.removeEventListener("mouseup", clear);
    };
  }, []);

  useEffect(() => {
    if (!trayRef.current || !canEdit) return;
    const d = new Draggable(trayRef.current, {
      itemSelector: "[data-template-id]",
      eventData: (el) => ({ title: el.getAttribute("data-title") ?? "", create: true, extendedProps: { templateId: el.getAttribute("data-template-id") } }),
    });
    return () => d.destroy();
  }, [canEdit]);

  const events: EventInput[] = useMemo(
    () =>
      (sessions.data ?? []).map((s) => ({
        id: s.id,
        title: `${s.log ? `${LOG_MARK[s.log.status]} ` : ""}${s.kind === "retest" ? "⟳ " : ""}${s.title} · ${Math.round(s.totalS / 60)} min`,
        start: s.date,
        allDay: true,
        classNames: [s.kind === "retest" ? "tm-retest" : "tm-session", s.minutesByZone[2] > 0 ? "tm-hard" : "tm-easy", ...(s.log ? [`tm-log-${s.log.status}`] : [])],
        extendedProps: { session: s },
      })),
    [sessions.data],
  );

  const seasonWeeks: SeasonWeekInfo[] = useMemo(() => (weeks.data ?? []).map((w) => ({ weekStart: w.weekStart, budget: presetOf(w.budget.name), block: w.block ?? "", retest: false })), [weeks.data]);

  function previewFor(date: string, moving: { id?: string; templateId?: string }) {
    const base: WeekSession[] = (sessions.data ?? []).map((s) => ({ id: s.id, date: s.date, title: s.title, kind: s.kind, minutesByZone: s.minutesByZone }));
    let next = base;
    if (moving.id) next = base.map((s) => (s.id === moving.id ? { ...s, date } : s));
    else if (moving.templateId) {
      const t = templates.find((x) => x.id === moving.templateId);
      if (t) next = [...base, { id: "__new", date, title: t.name, kind: "training", minutesByZone: t.minutesByZone }];
    }
    const week = mondayOf(date);
    const [summary] = summariseWeeks({ from: week, to: week, sessions: next, seasonWeeks, today: "0000-00-00" });
    setPreview(summary ?? null);
  }

  const fail = (e: unknown) =>
    setMessage({
      kind: "error",
      text:
        e instanceof ApiError && e.status === 409
          ? `${e.message} The calendar has been reloaded with the current plan.`
          : e instanceof ApiError
            ? `The server refused: ${e.message}`
            : "That did not work; the calendar shows the last saved plan.",
    });

  const moveTo = (s: SessionDto, date: string, revert?: () => void) => {
    setMessage(undefined);
    if (date === s.date) return;
    move.mutate(
      { id: s.id, date, scope: s.seriesId ? scope : "one", version: s.version },
      {
        onError: (e) => {
          revert?.();
          fail(e);
        },
        onSuccess: () => setMessage({ kind: "ok", text: `Moved "${s.title}" to ${date}.` }),
      },
    );
  };

  const onDrop = (info: EventDropArg) => {
    setPreview(null);
    moveTo(info.event.extendedProps.session as SessionDto, info.event.startStr.slice(0, 10), () => info.revert());
  };

  const onReceive = (info: EventReceiveArg) => {
    setPreview(null);
    const templateId = info.event.extendedProps.templateId as string | undefined;
    const existing = info.event.extendedProps.session as SessionDto | undefined;
    const date = info.event.startStr.slice(0, 10);
    info.event.remove();
    // The calendar can hand a planned session dragged within it over as a drop from outside (when the page re-renders
    // during the drag): that is a move, never a new session.
    if (existing) return moveTo(existing, date);
    if (!templateId) return setMessage({ kind: "error", text: "That drop was not a template; nothing was planned." });
    setMessage(undefined);
    create.mutate({ date, templateId }, { onError: fail, onSuccess: () => setMessage({ kind: "ok", text: `Planned "${info.event.title}" on ${date}.` }) });
  };

  const weekList = weeks.data ?? [];
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_16rem]">
      <div className="space-y-3">
        <div className="space-y-2" aria-live="polite">
          {weeks.isPending && range.from ? <p role="status" className="text-sm text-ink-soft">Checking the weeks against their budgets…</p> : null}
          {weeks.isError ? <FormAlert>The budget check could not be loaded: {weeks.error.message}</FormAlert> : null}
          {weekList.map((w) => (
            // The preview lies over the band instead of replacing it: the calendar must not move while something is dragged.
            <div key={w.weekStart} className="relative">
              <BudgetBand
                week={w}
                busy={move.isPending}
                onApplyFix={canEdit && w.fix ? () => move.mutate({ id: w.fix!.sessionId, date: w.fix!.toDate }, { onError: fail, onSuccess: () => setMessage({ kind: "ok", text: `Applied: ${w.fix!.message}` }) }) : undefined}
              />
              {preview && preview.weekStart === w.weekStart ? (
                <div className="absolute inset-x-0 top-0 z-20 shadow-lg">
                  <BudgetBand week={preview} preview />
                </div>
              ) : null}
            </div>
          ))}
        </div>
        {message ? message.kind === "ok" ? <FormNotice>{message.text}</FormNotice> : <FormAlert>{message.text}</FormAlert> : null}
        {sessions.isError ? <FormAlert>The sessions could not be loaded: {sessions.error.message}</FormAlert> : null}
        {canEdit && (sessions.data ?? []).some((s) => s.seriesId) ? (
          <fieldset className="flex flex-wrap gap-4 text-sm">
            <legend className="sr-only">Moving a repeating session</legend>
            <span className="font-semibold">Moving a repeating session changes</span>
            <label className="flex items-center gap-1"><input type="radio" checked={scope === "one"} onChange={() => setScope("one")} /> this occurrence</label>
            <label className="flex items-center gap-1"><input type="radio" checked={scope === "series"} onChange={() => setScope("series")} /> the series from here on</label>
          </fieldset>
        ) : null}
        <div className="tm-calendar rounded-lg border border-rule bg-paper p-2">
          <FullCalendar
            ref={calendarRef}
            plugins={[dayGridPlugin, interactionPlugin]}
            initialView="dayGridWeek"
            initialDate={initialDate}
            views={{ dayGridFourWeek: { type: "dayGrid", duration: { weeks: 4 }, buttonText: "4 weeks" } }}
            headerToolbar={{ left: "prev,next today", center: "title", right: "dayGridWeek,dayGridFourWeek,dayGridMonth" }}
            buttonText={{ today: "This week", week: "Week", month: "Month" }}
            firstDay={1}
            height="auto"
            editable={canEdit}
            droppable={canEdit}
            eventStartEditable={canEdit}
            eventDurationEditable={false}
            events={events}
            datesSet={(arg: DatesSetArg) => {
              const from = arg.startStr.slice(0, 10);
              const to = addDays(arg.endStr.slice(0, 10), -1);
              setRange((r) => (r.from === from && r.to === to ? r : { from, to }));
            }}
            eventAllow={(span, moving) => {
              const date = span.startStr.slice(0, 10);
              const s = moving?.extendedProps.session as SessionDto | undefined;
              previewFor(date, s ? { id: s.id } : { templateId: moving?.extendedProps.templateId as string });
              return true;
            }}
            eventDragStop={() => setPreview(null)}
            eventDrop={onDrop}
            eventReceive={onReceive}
            eventClick={(arg: EventClickArg) => {
              setSelected(arg.event.extendedProps.session as SessionDto);
              setEditing(false);
            }}
            eventContent={(arg) => {
              const s = arg.event.extendedProps.session as SessionDto | undefined;
              return (
                <div className="w-full overflow-hidden px-1" data-testid="calendar-event" data-log={s?.log?.status ?? "none"}>
                  <p className="truncate">{arg.event.title}</p>
                  {s?.log ? (
                    <div className="mt-0.5 h-1 w-full rounded bg-white/40" title={`${LOG_WORD[s.log.status]}: ${Math.round(s.log.compliance * 100)} % of the planned time`}>
                      <div className="h-full rounded bg-current" style={{ width: `${Math.min(100, s.log.compliance * 100)}%` }} />
                    </div>
                  ) : null}
                </div>
              );
            }}
          />
        </div>
        {selected ? (
          <section className="card space-y-2" aria-label="Selected session">
            <h3 className="font-bold">{selected.title} · {selected.date}</h3>
            <p className="num text-sm">{Math.round(selected.totalS / 60)} min · {zoneText(selected.minutesByZone)}{selected.rrule ? ` · repeats (${selected.rrule})` : ""}</p>
            {selected.log ? (
              <p className="num text-sm" data-testid="selected-log">
                <span className="font-semibold">{LOG_WORD[selected.log.status][0]!.toUpperCase() + LOG_WORD[selected.log.status].slice(1)}</span>
                {selected.log.durationMin != null ? ` · ${Math.round(selected.log.durationMin)} min (${Math.round(selected.log.compliance * 100)} % of plan)` : ""}
                {selected.log.rpe != null ? ` · RPE ${selected.log.rpe}` : ""}
                {selected.log.measuredMinByZone ? ` · measured ${zoneText(selected.log.measuredMinByZone)}` : ""}
              </p>
            ) : <p className="text-sm text-ink-soft">Not logged yet.</p>}
            {canEdit && editing ? (
              <SessionEditor
                athleteId={athleteId}
                session={selected}
                onCancel={() => setEditing(false)}
                onDone={(text) => {
                  setEditing(false);
                  setSelected(null);
                  setMessage({ kind: "ok", text });
                }}
              />
            ) : null}
            {canEdit && !editing ? (
              <div className="flex flex-wrap gap-2 text-sm">
                <button type="button" className="btn-quiet py-1" onClick={() => setEditing(true)}>Edit steps and notes</button>
                <MoveToDay
                  key={selected.id}
                  session={selected}
                  busy={move.isPending}
                  onMove={(date) =>
                    move.mutate(
                      { id: selected.id, date, scope: selected.seriesId ? scope : "one", version: selected.version },
                      {
                        onError: (e) => {
                          fail(e);
                          // Its details are out of date: close them; the reloaded calendar shows the session as it is.
                          if (e instanceof ApiError && e.status === 409) setSelected(null);
                        },
                        onSuccess: () => {
                          setSelected(null);
                          setMessage({ kind: "ok", text: `Moved "${selected.title}" to ${date}.` });
                          calendarRef.current?.getApi().gotoDate(date);
                        },
                      },
                    )
                  }
                />
                <DuplicateButton sessionId={selected.id} date={addDays(selected.date, 7)} onDone={(t) => setMessage({ kind: "ok", text: t })} onError={fail} athleteId={athleteId} />
                <button type="button" className="btn-quiet py-1" onClick={() => remove.mutate({ id: selected.id, scope: "one" }, { onSuccess: () => { setSelected(null); setMessage({ kind: "ok", text: "Session deleted." }); }, onError: fail })}>Delete</button>
                {selected.seriesId ? <button type="button" className="btn-quiet py-1" onClick={() => remove.mutate({ id: selected.id, scope: "series" }, { onSuccess: () => { setSelected(null); setMessage({ kind: "ok", text: "Series deleted from this occurrence on." }); }, onError: fail })}>Delete the series from here</button> : null}
                <button type="button" className="text-sm underline" onClick={() => setSelected(null)}>Close</button>
              </div>
            ) : null}
          </section>
        ) : null}
      </div>
      {canEdit ? (
        <aside aria-labelledby="tray-heading" className="space-y-3">
          <h2 id="tray-heading" className="font-bold">Template tray</h2>
          <p className="text-xs text-ink-soft">Drag a template onto a day. The band of the week shows the result before you drop.</p>
          {templates.length === 0 ? <p className="text-sm text-ink-soft">No templates yet. Build one on the templates page.</p> : null}
          <ul ref={trayRef} className="space-y-2">
            {templates.map((t) => (
              <li key={t.id} data-template-id={t.id} data-title={t.name} className="cursor-grab rounded-md border border-rule bg-paper p-2 text-sm shadow-sm hover:border-tide">
                <p className="font-semibold">{t.name}</p>
                <p className="num text-xs text-ink-soft">{Math.round(t.totalS / 60)} min · {zoneText(t.minutesByZone)}</p>
              </li>
            ))}
          </ul>
          <KeyboardPlanner templates={templates} defaultDate={range.from || initialDate} onPlan={(templateId, date, repeat) => create.mutate(repeat ? { date, templateId, repeat } : { date, templateId }, { onError: fail, onSuccess: (r) => { const n = (r as { ids?: string[] }).ids?.length ?? 1; setMessage({ kind: "ok", text: n > 1 ? `Planned ${n} sessions from ${date}.` : `Planned on ${date}.` }); calendarRef.current?.getApi().gotoDate(date); } })} />
        </aside>
      ) : null}
    </div>
  );
}

/** Moving a session without dragging: choose the new day. */
function MoveToDay({ session, busy, onMove }: { session: SessionDto; busy: boolean; onMove: (date: string) => void }) {
  const [date, setDate] = useState(session.date);
  return (
    <form
      className="flex items-center gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        if (date && date !== session.date) onMove(date);
      }}
    >
      <label htmlFor={`move-${session.id}`} className="sr-only">New day for {session.title}</label>
      <input id={`move-${session.id}`} type="date" className="field-input mt-0 w-40 py-1 num" value={date} onChange={(e) => setDate(e.target.value)} />
      <SubmitButton className="btn-quiet py-1" disabled={busy || !date || date === session.date}>Move to this day</SubmitButton>
    </form>
  );
}

function DuplicateButton({ sessionId, date, onDone, onError, athleteId }: { sessionId: string; date: string; onDone: (t: string) => void; onError: (e: unknown) => void; athleteId: string }) {
  const qc = useQueryClient();
  const [busy, setBusy] = useState(false);
  return (
    <button
      type="button"
      className="btn-quiet py-1"
      disabled={busy}
      onClick={async () => {
        setBusy(true);
        try {
          await apiFetch(`/api/sessions/${sessionId}`, { method: "POST", body: JSON.stringify({ date }) });
          await invalidatePlan(qc, athleteId);
          onDone(`Copied to ${date}.`);
        } catch (e) {
          onError(e);
        } finally {
          setBusy(false);
        }
      }}
    >
      Copy to the next week
    </button>
  );
}

const WEEKDAY_LABELS: Record<(typeof WEEKDAYS)[number], string> = { MO: "Mon", TU: "Tue", WE: "Wed", TH: "Thu", FR: "Fri", SA: "Sat", SU: "Sun" };

/** Planning without a pointer: choose a template and a day, and optionally repeat it weekly (an RRULE). */
function KeyboardPlanner({ templates, defaultDate, onPlan }: { templates: TrayTemplate[]; defaultDate: string; onPlan: (templateId: string, date: string, repeat?: Repeat) => void }) {
  const [templateId, setTemplateId] = useState("");
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
      className="space-y-2 rounded-md border border-rule p-2 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        setProblem("");
        if (!templateId || !date) return;
        if (!repeats) return onPlan(templateId, date);
        if (!days.length) return setProblem("Choose at least one weekday to repeat on.");
        if (endBy === "until" && !until) return setProblem("Give the last date of the repeat, or a number of sessions.");
        if (endBy === "count" && !(count >= 1 && count <= 104)) return setProblem("Repeat between 1 and 104 times.");
        onPlan(templateId, date, endBy === "count" ? { byWeekday: days, count } : { byWeekday: days, until });
      }}
    >
      <p className="font-semibold">Plan without dragging</p>
      <fieldset disabled={!hydrated} className="space-y-2">
        <div>
          <label htmlFor="kp-template" className="field-label">Template</label>
          <select id="kp-template" className="field-input" value={templateId} onChange={(e) => setTemplateId(e.target.value)}>
            <option value="">Choose…</option>
            {templates.map((t) => <option key={t.id} value={t.id}>{t.name}</option>)}
          </select>
        </div>
        <div>
          <label htmlFor="kp-day" className="field-label">Day</label>
          <input id="kp-day" type="date" className="field-input num" value={date} onChange={(e) => setDate(e.target.value)} />
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
                    <input type="checkbox" checked={days.includes(d)} onChange={(e) => setDays((x) => (e.target.checked ? [...x, d] : x.filter((y) => y !== d)))} />
                    {WEEKDAY_LABELS[d]}
                  </label>
                ))}
              </div>
            </fieldset>
            <fieldset className="space-y-1">
              <legend className="field-label">Ends</legend>
              <label className="flex items-center gap-1">
                <input type="radio" checked={endBy === "count"} onChange={() => setEndBy("count")} /> after
                <input aria-label="Number of sessions" type="number" min={1} max={104} className="field-input mt-0 w-16 num" value={count} onChange={(e) => setCount(Number(e.target.value))} /> sessions
              </label>
              <label className="flex items-center gap-1">
                <input type="radio" checked={endBy === "until"} onChange={() => setEndBy("until")} /> on
                <input aria-label="Last date" type="date" className="field-input mt-0 num" value={until} onChange={(e) => setUntil(e.target.value)} />
              </label>
            </fieldset>
          </div>
        ) : null}
        {problem ? <p role="alert" className="text-alert">{problem}</p> : null}
        <SubmitButton className="btn w-full" disabled={!templateId || !date}>{repeats ? "Plan the series" : "Plan it"}</SubmitButton>
      </fieldset>
    </form>
  );
}
