"use client";
import dayGridPlugin from "@fullcalendar/daygrid";
import interactionPlugin, { Draggable } from "@fullcalendar/interaction";
import FullCalendar from "@fullcalendar/react";
import type { DatesSetArg, EventClickArg, EventDropArg, EventInput } from "@fullcalendar/core";
import type { EventReceiveArg } from "@fullcalendar/interaction";
import { useEffect, useMemo, useRef, useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { ApiError } from "@/features/platform/lib/api-client";
import { addDays } from "@/features/platform/lib/days";
import { useCreateSession, useDeleteSession, useMoveSession, useSessions, useWeeks, type SessionDto } from "../api";
import { BudgetBand } from "./BudgetBand";
import { KeyboardPlanner } from "./KeyboardPlanner";
import { SelectedSession } from "./SelectedSession";
import { LOG_MARK, LOG_WORD, zoneText } from "./session-text";
import { useDragPreview } from "./use-drag-preview";

export interface TrayTemplate {
  id: string;
  name: string;
  sport: string;
  totalS: number;
  minutesByZone: [number, number, number];
}

export function PlanCalendar({
  athleteId,
  templates,
  initialDate,
  canEdit,
}: {
  athleteId: string;
  templates: TrayTemplate[];
  initialDate: string;
  canEdit: boolean;
}) {
  const calendarRef = useRef<FullCalendar>(null);
  const trayRef = useRef<HTMLUListElement>(null);
  const [range, setRange] = useState<{ from: string; to: string }>({ from: "", to: "" });
  const [message, setMessage] = useState<{ kind: "ok" | "error"; text: string }>();
  const [selected, setSelected] = useState<SessionDto | null>(null);
  const [scope, setScope] = useState<"one" | "series">("one");
  const sessions = useSessions(athleteId, range.from, range.to);
  const weeks = useWeeks(athleteId, range.from, range.to);
  const move = useMoveSession(athleteId, range.from, range.to);
  const create = useCreateSession(athleteId);
  const remove = useDeleteSession(athleteId);
  const { preview, previewFor, clearPreview } = useDragPreview(sessions.data, weeks.data, templates);

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
        onSuccess: () => setMessage({ kind: "ok", text: `Moved "${s.title}" to ${date}.` }),
      },
    );
  };

  const onDrop = (info: EventDropArg) => {
    clearPreview();
    moveTo(info.event.extendedProps.session as SessionDto, info.event.startStr.slice(0, 10), () => info.revert());
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
    setMessage(undefined);
    create.mutate(
      { date, templateId },
      { onError: fail, onSuccess: () => setMessage({ kind: "ok", text: `Planned "${info.event.title}" on ${date}.` }) },
    );
  };

  const weekList = weeks.data ?? [];
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_16rem]">
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
              <BudgetBand
                week={w}
                busy={move.isPending}
                onApplyFix={
                  canEdit && w.fix
                    ? () =>
                        move.mutate(
                          { id: w.fix!.sessionId, date: w.fix!.toDate },
                          {
                            onError: fail,
                            onSuccess: () => setMessage({ kind: "ok", text: `Applied: ${w.fix!.message}` }),
                          },
                        )
                    : undefined
                }
              />
              {preview && preview.weekStart === w.weekStart ? (
                <div className="absolute inset-x-0 top-0 z-20 shadow-lg">
                  <BudgetBand week={preview} preview />
                </div>
              ) : null}
            </div>
          ))}
        </div>
        {message ? (
          message.kind === "ok" ? (
            <FormNotice>{message.text}</FormNotice>
          ) : (
            <FormAlert>{message.text}</FormAlert>
          )
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
                  <p className="truncate">{arg.event.title}</p>
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
                    setMessage({ kind: "ok", text: `Moved "${selected.title}" to ${date}.` });
                    calendarRef.current?.getApi().gotoDate(date);
                  },
                },
              )
            }
          />
        ) : null}
      </div>
      {canEdit ? (
        <aside aria-labelledby="tray-heading" className="space-y-3">
          <h2 id="tray-heading" className="font-bold">
            Template tray
          </h2>
          <p className="text-xs text-ink-soft">
            Drag a template onto a day. The band of the week shows the result before you drop.
          </p>
          {templates.length === 0 ? (
            <p className="text-sm text-ink-soft">No templates yet. Build one on the templates page.</p>
          ) : null}
          <ul ref={trayRef} className="space-y-2">
            {templates.map((t) => (
              <li
                key={t.id}
                data-template-id={t.id}
                data-title={t.name}
                className="cursor-grab rounded-md border border-rule bg-paper p-2 text-sm shadow-sm hover:border-tide"
              >
                <p className="font-semibold">{t.name}</p>
                <p className="num text-xs text-ink-soft">
                  {Math.round(t.totalS / 60)} min · {zoneText(t.minutesByZone)}
                </p>
              </li>
            ))}
          </ul>
          <KeyboardPlanner
            templates={templates}
            defaultDate={range.from || initialDate}
            onPlan={(templateId, date, repeat) =>
              create.mutate(repeat ? { date, templateId, repeat } : { date, templateId }, {
                onError: fail,
                onSuccess: (r) => {
                  const n = (r as { ids?: string[] }).ids?.length ?? 1;
                  setMessage({
                    kind: "ok",
                    text: n > 1 ? `Planned ${n} sessions from ${date}.` : `Planned on ${date}.`,
                  });
                  calendarRef.current?.getApi().gotoDate(date);
                },
              })
            }
          />
        </aside>
      ) : null}
    </div>
  );
}
