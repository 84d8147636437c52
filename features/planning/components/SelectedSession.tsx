"use client";
import dynamic from "next/dynamic";
import { useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { apiFetch } from "@/features/platform/lib/api-client";
import { Day, useDates } from "@/features/platform/components/dates";
import { addDays } from "@/features/platform/lib/days";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { invalidatePlan, type SessionDto } from "../api";
import { LOG_WORD, zoneText } from "./session-text";
import { ThreadPanel } from "@/features/threads/components/ThreadPanel";

// The editor brings the form and validation libraries; it loads when a coach first opens it, not with the calendar.
const SessionEditor = dynamic(() => import("./SessionEditor").then((m) => m.SessionEditor), {
  ssr: false,
  loading: () => (
    <p role="status" className="text-sm text-ink-soft">
      Opening the editor…
    </p>
  ),
});

export interface SelectedSessionProps {
  athleteId: string;
  session: SessionDto;
  canEdit: boolean;
  busy: boolean;
  onMove: (date: string) => void;
  onDelete: (scope: "one" | "series") => void;
  onClose: () => void;
  /** A change was made (edited, copied); the text says what. */
  onDone: (text: string) => void;
  onError: (e: unknown) => void;
}

/** The session picked on the calendar: its numbers and log, and (for its coaches) edit, move, copy and delete. */
export function SelectedSession({
  athleteId,
  session: selected,
  canEdit,
  busy,
  onMove,
  onDelete,
  onClose,
  onDone,
  onError,
}: SelectedSessionProps) {
  const [editing, setEditing] = useState(false);
  return (
    <section className="card space-y-2" aria-label="Selected session">
      <h3 className="font-bold">
        {selected.title} · <Day value={selected.date} weekday />
      </h3>
      <p className="num text-sm">
        {Math.round(selected.totalS / 60)} min · {zoneText(selected.minutesByZone)}
        {selected.rrule ? ` · repeats (${selected.rrule})` : ""}
      </p>
      {selected.log ? (
        <p className="num text-sm" data-testid="selected-log">
          <span className="font-semibold">
            {LOG_WORD[selected.log.status][0]!.toUpperCase() + LOG_WORD[selected.log.status].slice(1)}
          </span>
          {selected.log.durationMin != null
            ? ` · ${Math.round(selected.log.durationMin)} min (${Math.round(selected.log.compliance * 100)} % of plan)`
            : ""}
          {selected.log.rpe != null ? ` · RPE ${selected.log.rpe}` : ""}
          {selected.log.measuredMinByZone ? ` · measured ${zoneText(selected.log.measuredMinByZone)}` : ""}
        </p>
      ) : (
        <p className="text-sm text-ink-soft">Not logged yet.</p>
      )}
      {selected.structure.length ? (
        <p className="text-sm">
          <a className="font-semibold text-tide underline" href={`/api/sessions/${selected.id}/workout`} download>
            Download for a watch (.fit workout)
          </a>
        </p>
      ) : null}
      {canEdit && editing ? (
        <SessionEditor
          athleteId={athleteId}
          session={selected}
          onCancel={() => setEditing(false)}
          onDone={(text) => {
            setEditing(false);
            onClose();
            onDone(text);
          }}
        />
      ) : null}
      {canEdit && !editing ? (
        <div className="flex flex-wrap gap-2 text-sm">
          <button type="button" className="btn-quiet py-1" onClick={() => setEditing(true)}>
            Edit steps and notes
          </button>
          <MoveToDay key={selected.id} session={selected} busy={busy} onMove={onMove} />
          <DuplicateButton
            sessionId={selected.id}
            date={addDays(selected.date, 7)}
            onDone={onDone}
            onError={onError}
            athleteId={athleteId}
          />
          <button type="button" className="btn-quiet py-1" onClick={() => onDelete("one")}>
            Delete
          </button>
          {selected.seriesId ? (
            <button type="button" className="btn-quiet py-1" onClick={() => onDelete("series")}>
              Delete the series from here
            </button>
          ) : null}
          <button type="button" className="text-sm underline" onClick={onClose}>
            Close
          </button>
        </div>
      ) : null}
      <ThreadPanel key={selected.id} kind="session" id={selected.id} />
    </section>
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
      <label htmlFor={`move-${session.id}`} className="sr-only">
        New day for {session.title}
      </label>
      <input
        id={`move-${session.id}`}
        type="date"
        className="field-input mt-0 w-40 py-1 num"
        value={date}
        onChange={(e) => setDate(e.target.value)}
      />
      <SubmitButton className="btn-quiet py-1" disabled={busy || !date || date === session.date}>
        Move to this day
      </SubmitButton>
    </form>
  );
}

function DuplicateButton({
  sessionId,
  date,
  onDone,
  onError,
  athleteId,
}: {
  sessionId: string;
  date: string;
  onDone: (t: string) => void;
  onError: (e: unknown) => void;
  athleteId: string;
}) {
  const qc = useQueryClient();
  const dates = useDates();
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
          onDone(`Copied to ${dates.day(date)}.`);
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
