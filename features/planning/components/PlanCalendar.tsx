"use client";
import dayGridPlugin from "@fullcalendar/daygrid";
import interactionPlugin, { Draggable } from "@fullcalendar/interaction";
import FullCalendar from "@fullcalendar/react";
import type { DatesSetArg, EventClickArg, EventDropArg, EventInput } from "@fullcalendar/core";
import type { EventReceiveArg } from "@fullcalendar/interaction";
import { useEffect, useMemo, useRef, useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { useQueryClient } from "@tanstack/react-query";
import { CopyWeek } from "./CopyWeek";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { addDays, mondayOf } from "@/features/platform/lib/days";
import {
  invalidatePlan,
  useCreateSession,
  useDeleteSession,
  useMoveSession,
  useSessions,
  useWeeks,
  type SessionDto,
} from "../api";
import type { Fix } from "../lib/weeks";
import { BudgetBand } from "./BudgetBand";
import { SPORT_LABELS, type Sport } from "@/features/platform/lib/sports";
import type { Repeat } from "../lib/repeat";
import { KeyboardPlanner } from "./KeyboardPlanner";
import { TemplateDock } from "./TemplateDock";
import { SelectedSession } from "./SelectedSession";
import { LOG_MARK, LOG_WORD } from "./session-text";
import { useDragPreview } from "./use-drag-preview";
import { titleWithLength } from "../lib/title";
import { useDates } from "@/features/platform/components/dates";

export interface TrayTemplate {
  id: string;
  name: string;
  sport: string;
  totalS: number;
  minutesByZone: [number, number, number];
}

const WEEKDAYS = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"];
/** A calendar day (a local Date at midnight) as YYYY-MM-DD. */
const localIso = (d: Date) =>
  `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;

export function PlanCalendar({
  athleteId,
  templates,
  initialDate,
  canEdit,
  athleteSports = [],
}: {
  athleteId: string;
  templates: TrayTemplate[];
  initialDate: string;
  canEdit: boolean;
  /** The athlete's sports: the tray shows them first, and a template of another sport asks before it is planned. */
  athleteSports?: string[];
}) {
  const dates = useDates();
  const calendarRef = useRef<FullCalendar>(null);
  const trayRef = useRef<HTMLUListElement>(null);
  // The first week shown is known before the calendar mounts: its sessions and summaries come with the page.
  const [range, setRange] = useState<{ from: string; to: string }>(() => {
    const from = mondayOf(initialDate);
    return { from, to: addDays(from, 6) };
  });
  const [message, setMessage] = useState<{ kind: "ok" | "error"; text: string }>();
  const [selected, setSelected] = useState<SessionDto | null>(null);
  const [scope, setScope] = useState<"one" | "series">("one");
  /** A template of another sport, dropped or chosen: planned only once the coach confirms. */
  const [pending, setPending] = useState<{ templateId: string; date: string; repeat?: Repeat } | null>(null);
  const [picked, setPicked] = useState<{ id: string; n: number } | null>(null);
  const plannerRef = useRef<HTMLDetailsElement>(null);
  const sessions = useSessions(athleteId, range.from, range.to);
  const weeks = useWeeks(athleteId, range.from, range.to);
  const move = useMoveSession(athleteId, range.from, range.to);
  const create = useCreateSession(athleteId);
  const remove = useDeleteSession(athleteId);
  const qc = useQueryClient();
  const { preview, previewFor, clearPreview } = useDragPreview(sessions.data, weeks.data, templates);

  // The calendar's arrow icons are decoration (role img without a name): the buttons carry their names (buttonHints).
  useEffect(() => {
    document.querySelectorAll(".tm-calendar .fc-icon").forEach((el) => el.setAttribute("aria-hidden", "true"));
  });

  // A week chosen on the season ribbon arrives as a new initial date while the calendar stays mounted.
  useEffect(() => {
    calendarRef.current?.getApi().gotoDate(initialDate);
  }, [initialDate]);

  useEffect(() => {
    if (!trayRef.current || !canEdit) return;
    const d = new Draggable(trayRef.current, {
      itemSelector: "[data-template-id]",
      eventData: (el) => ({
        title: el.getAttribute("data-title") ?? "",
        create: true,
        extendedProps: { templateId: el.getAttribute("data-template-id") },
      }),
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
        classNames: [
          s.kind === "retest" ? "tm-retest" : "tm-session",
          s.minutesByZone[2] > 0 ? "tm-hard" : "tm-easy",
          ...(s.log ? [`tm-log-${s.log.status}`] : []),
        ],
        extendedProps: { session: s },
      })),
    [sessions.data],
  );

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
        onSuccess: () => setMessage({ kind: "ok", text: `Moved "${s.title}" to ${dates.day(date)}.` }),
      },
    );
  };

  const onDrop = (info: EventDropArg) => {
    clearPreview();
    moveTo(info.event.extendedProps.session as SessionDto, info.event.startStr.slice(0, 10), () => info.revert());
  };

  const otherSport = (templateId: string) => {
    const t = templates.find((x) => x.id === templateId);
    return t && athleteSports.length > 0 && !athleteSports.includes(t.sport) ? t : null;
  };

  /** Plans a template on a day (or as a weekly series); a template of another sport waits for the coach's yes. */
  const planTemplate = (templateId: string, date: string, repeat?: Repeat, confirmed = false) => {
    if (!confirmed && otherSport(templateId)) return setPending({ templateId, date, repeat });
    setPending(null);
    setMessage(undefined);
    const name = templates.find((t) => t.id === templateId)?.name ?? "the template";
    create.mutate(repeat ? { date, templateId, repeat } : { date, templateId }, {
      onError: fail,
      onSuccess: (r) => {
        const n = (r as { ids?: string[] }).ids?.length ?? 1;
        setMessage({
          kind: "ok",
          text:
            n > 1
              ? `Planned ${n} sessions of "${name}" from ${dates.day(date)}.`
              : `Planned "${name}" on ${dates.day(date)}.`,
        });
        calendarRef.current?.getApi().gotoDate(date);
      },
    });
  };

  /** Applies one of a week's fixes: move the session, swap it for the template, or add the easy session. */
  const applyFix = async (fix: Fix) => {
    setMessage(undefined);
    const done = () => setMessage({ kind: "ok", text: `Applied: ${fix.message}` });
    if (fix.action === "move")
      return move.mutate({ id: fix.sessionId, date: fix.toDate }, { onError: fail, onSuccess: done });
    if (fix.action === "add") {
      const structure = [{ type: "step", kind: "work", durationS: fix.minutes * 60, zone: 1 }];
      return create.mutate(
        { date: fix.date, title: fix.title, sport: fix.sport, structure },
        { onError: fail, onSuccess: done },
      );
    }
    try {
      const version = sessions.data?.find((x) => x.id === fix.sessionId)?.version;
      const change =
        fix.action === "shorten"
          ? { structure: fix.structure }
          : await apiFetch<{ name: string; structure: unknown }>(
              `/api/templates/${encodeURIComponent(fix.templateId)}`,
            ).then((t) => ({ title: t.name, structure: t.structure }));
      await apiFetch(`/api/sessions/${encodeURIComponent(fix.sessionId)}`, {
        method: "PATCH",
        body: JSON.stringify({ ...change, version }),
      });
      await invalidatePlan(qc, athleteId);
      done();
    } catch (e) {
      await invalidatePlan(qc, athleteId);
      fail(e);
    }
  };

  const onReceive = (info: EventReceiveArg) => {
    clearPreview();
    const templateId = info.event.extendedProps.templateId as string | undefined;
    const existing = info.event.extendedProps.session as SessionDto | undefined;
    const date = info.event.startStr.slice(0, 10);
    info.event.remove();
    // The calendar can hand a planned session dragged within it over as a drop from outside (when the page re-renders
    // during the drag): that is a move, never a new session.
    if (existing) return moveTo(existing, date);
    if (!templateId) return setMessage({ kind: "error", text: "That drop was not a template; nothing was planned." });
    planTemplate(templateId, date);
  };

  const weekList = weeks.data ?? [];
  const weekByStart = new Map(weekList.map((w) => [w.weekStart, w]));
  return (
    <div id="plan-calendar" tabIndex={-1} className="space-y-6 focus:outline-none">
      <div className="space-y-3">
        <div className="space-y-2" aria-live="polite">
          {weeks.isPending && range.from ? (
            <p role="status" className="text-sm text-ink-soft">
              Checking the weeks against their budgets…
            </p>
          ) : null}
          {weeks.isError ? <FormAlert>The budget check could not be loaded: {weeks.error.message}</FormAlert> : null}
          {weekList.map((w) => (
            // The preview lies over the band instead of replacing it: the calendar must not move while something is dragged.
            <div key={w.weekStart} className="relative">
              <BudgetBand week={w} busy={move.isPending} onApplyFix={canEdit ? applyFix : undefined} />
              {preview && preview.weekStart === w.weekStart ? (
                <div className="absolute inset-x-0 top-0 z-20 shadow-lg">
                  <BudgetBand week={preview} preview />
                </div>
              ) : null}
            </div>
          ))}
        </div>
        {canEdit && weekList.length ? (
          <CopyWeek
            athleteId={athleteId}
            weekStarts={weekList.map((w) => w.weekStart)}
            onCopied={() => invalidatePlan(qc, athleteId)}
          />
        ) : null}
        {message ? (
          message.kind === "ok" ? (
            <FormNotice>{message.text}</FormNotice>
          ) : (
            <FormAlert>{message.text}</FormAlert>
          )
        ) : null}
        {pending ? (
          <div
            role="alertdialog"
            aria-labelledby="other-sport-q"
            className="rounded-md border border-alert/60 bg-alert-wash/50 p-3 text-sm"
          >
            <p id="other-sport-q" className="font-semibold">
              &quot;{otherSport(pending.templateId)?.name}&quot; is a{" "}
              {SPORT_LABELS[otherSport(pending.templateId)?.sport as Sport]?.toLowerCase() ?? "different"} template, and
              this athlete trains {athleteSports.map((x) => SPORT_LABELS[x as Sport]?.toLowerCase() ?? x).join(", ")}.
              Plan it on {dates.day(pending.date)} anyway?
            </p>
            <div className="mt-2 flex gap-2">
              <button
                type="button"
                className="btn py-1"
                onClick={() => planTemplate(pending.templateId, pending.date, pending.repeat, true)}
              >
                Plan it anyway
              </button>
              <button type="button" className="btn-quiet py-1" onClick={() => setPending(null)}>
                Do not plan it
              </button>
            </div>
          </div>
        ) : null}
        {sessions.isError ? <FormAlert>The sessions could not be loaded: {sessions.error.message}</FormAlert> : null}
        {canEdit && (sessions.data ?? []).some((s) => s.seriesId) ? (
          <fieldset className="flex flex-wrap gap-4 text-sm">
            <legend className="sr-only">Moving a repeating session</legend>
            <span className="font-semibold">Moving a repeating session changes</span>
            <label className="flex items-center gap-1">
              <input type="radio" checked={scope === "one"} onChange={() => setScope("one")} /> this occurrence
            </label>
            <label className="flex items-center gap-1">
              <input type="radio" checked={scope === "series"} onChange={() => setScope("series")} /> the series from
              here on
            </label>
          </fieldset>
        ) : null}
        <div className="tm-calendar rounded-lg border border-rule bg-paper p-2">
          <FullCalendar
            ref={calendarRef}
            plugins={[dayGridPlugin, interactionPlugin]}
            initialView="dayGridWeek"
            initialDate={initialDate}
            views={{ dayGridFourWeek: { type: "dayGrid", duration: { weeks: 4 }, buttonText: "4 weeks" } }}
            headerToolbar={{
              left: "prev,next today",
              center: "title",
              right: "dayGridWeek,dayGridFourWeek,dayGridMonth",
            }}
            buttonText={{ today: "This week", week: "Week", month: "Month" }}
            // One date format everywhere in Tidemark: the reader's own date style (platform/lib/date-format.ts).
            titleFormat={(arg) => {
              const iso = (m: { year: number; month: number; day: number }) =>
                `${m.year}-${String(m.month + 1).padStart(2, "0")}-${String(m.day).padStart(2, "0")}`;
              return dates.range(iso(arg.start), arg.end ? iso(arg.end) : iso(arg.start));
            }}
            dayHeaderContent={(arg) =>
              arg.view.type === "dayGridWeek"
                ? dates.day(localIso(arg.date), { weekday: true, year: false })
                : WEEKDAYS[(arg.date.getDay() + 6) % 7]
            }
            dayCellContent={(arg) => {
              const iso = localIso(arg.date);
              const w = arg.view.type !== "dayGridWeek" && arg.date.getDay() === 1 ? weekByStart.get(iso) : undefined;
              return (
                <span className="flex w-full items-center justify-between gap-1">
                  {w ? (
                    <span
                      className={`rounded px-1 text-[10px] font-semibold ${w.overBudget ? "bg-alert-wash text-alert" : "text-ink-soft"}`}
                      title={w.overBudget ? w.flags.map((f) => f.message).join(" ") : "Within its budget"}
                    >
                      {w.overBudget ? "! over budget" : w.inProgress ? "in progress" : "✓ budget"}
                    </span>
                  ) : (
                    <span />
                  )}
                  <span className="num">
                    {arg.date.getDate() === 1 || iso === localIso(arg.view.activeStart)
                      ? dates.day(iso, { year: false })
                      : arg.date.getDate()}
                  </span>
                </span>
              );
            }}
            firstDay={1}
            height="auto"
            editable={canEdit}
            droppable={canEdit}
            eventStartEditable={canEdit}
            eventDurationEditable={false}
            events={events}
            buttonHints={{ prev: "Previous $0", next: "Next $0", today: "This $0" }}
            datesSet={(arg: DatesSetArg) => {
              // The arrow icons are decoration: the buttons carry their names (buttonHints).
              document
                .querySelectorAll(".tm-calendar .fc-icon")
                .forEach((el) => el.setAttribute("aria-hidden", "true"));
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
            eventDragStop={() => clearPreview()}
            eventDrop={onDrop}
            eventReceive={onReceive}
            eventClick={(arg: EventClickArg) => setSelected(arg.event.extendedProps.session as SessionDto)}
            eventContent={(arg) => {
              const s = arg.event.extendedProps.session as SessionDto | undefined;
              return (
                <div
                  className="w-full overflow-hidden px-1"
                  data-testid="calendar-event"
                  data-log={s?.log?.status ?? "none"}
                >
                  <p className="tm-event-title">{arg.event.title}</p>
                  {s?.log ? (
                    <div
                      className="mt-0.5 h-1 w-full rounded bg-white/40"
                      title={`${LOG_WORD[s.log.status]}: ${Math.round(s.log.compliance * 100)} % of the planned time`}
                    >
                      <div
                        className="h-full rounded bg-current"
                        style={{ width: `${Math.min(100, s.log.compliance * 100)}%` }}
                      />
                    </div>
                  ) : null}
                </div>
              );
            }}
          />
        </div>
        {/* Phones: the week as a list (the grid is too narrow to read), each session opening like a calendar entry. */}
        <ol className="space-y-2 sm:hidden" aria-label="The sessions of these days" data-testid="week-agenda">
          {Array.from(
            { length: range.from ? Math.round((Date.parse(range.to) - Date.parse(range.from)) / 86_400_000) + 1 : 0 },
            (_, i) => addDays(range.from, i),
          ).map((day) => {
            const list = (sessions.data ?? []).filter((x) => x.date === day);
            return (
              <li key={day} className="rounded-md border border-rule bg-paper px-3 py-2">
                <p className="num text-sm font-semibold">{dates.day(day, { weekday: true })}</p>
                {list.length ? (
                  <ul className="mt-1 space-y-1">
                    {list.map((x) => (
                      <li key={x.id}>
                        <button
                          type="button"
                          className="w-full rounded px-1 py-0.5 text-left text-sm hover:bg-tide/10"
                          onClick={() => setSelected(x)}
                        >
                          {x.log ? `${LOG_MARK[x.log.status]} ` : ""}
                          {x.kind === "retest" ? "⟳ " : ""}
                          {titleWithLength(x.title, Math.round(x.totalS / 60))}
                          {x.minutesByZone[2] > 0 ? ` · zone 3 ${Math.round(x.minutesByZone[2])} min` : ""}
                        </button>
                      </li>
                    ))}
                  </ul>
                ) : (
                  <p className="text-xs text-ink-soft">Rest day</p>
                )}
              </li>
            );
          })}
        </ol>
        {selected ? (
          <SelectedSession
            key={selected.id}
            athleteId={athleteId}
            session={selected}
            canEdit={canEdit}
            busy={move.isPending}
            onClose={() => setSelected(null)}
            onDone={(text) => setMessage({ kind: "ok", text })}
            onError={fail}
            onDelete={(which) =>
              remove.mutate(
                { id: selected.id, scope: which },
                {
                  onSuccess: () => {
                    setSelected(null);
                    setMessage({
                      kind: "ok",
                      text: which === "series" ? "Series deleted from this occurrence on." : "Session deleted.",
                    });
                  },
                  onError: fail,
                },
              )
            }
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
                    setMessage({ kind: "ok", text: `Moved "${selected.title}" to ${dates.day(date)}.` });
                    calendarRef.current?.getApi().gotoDate(date);
                  },
                },
              )
            }
          />
        ) : null}
      </div>
      {canEdit ? (
        <details ref={plannerRef} className="card" data-testid="keyboard-planner">
          <summary className="cursor-pointer font-semibold">Plan without dragging</summary>
          <KeyboardPlanner
            key={picked ? `${picked.id}-${picked.n}` : "none"}
            templates={templates}
            initialTemplateId={picked?.id}
            defaultDate={range.from || initialDate}
            onPlan={(templateId, date, repeat) => planTemplate(templateId, date, repeat)}
          />
        </details>
      ) : null}
      {canEdit ? (
        <TemplateDock
          templates={templates}
          athleteSports={athleteSports}
          listRef={trayRef}
          onChoose={(id) => {
            setPicked((p) => ({ id, n: (p?.n ?? 0) + 1 }));
            if (plannerRef.current) plannerRef.current.open = true;
            setTimeout(() => document.getElementById("kp-day")?.focus(), 0);
          }}
        />
      ) : null}
    </div>
  );
}
