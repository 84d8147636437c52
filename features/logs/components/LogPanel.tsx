"use client";
import { distanceIn, distanceText, toKm, type Units } from "@/features/platform/lib/units";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { uploadWithProgress } from "@/features/platform/lib/upload";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { anchorOf, CR10_ANCHORS } from "../lib/cr10";
import { LOG_STATUS_LABELS } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { useHydrated } from "@/features/platform/components/use-hydrated";

export interface LogView {
  id: string;
  status: "done" | "partial" | "skipped";
  durationMin: number | null;
  distanceKm: number | null;
  rpe: number | null;
  notes: string;
  skipReason: string | null;
  measuredMinByZone: [number, number, number] | null;
  zoneMeasure: string | null;
  /** Logs can be changed for 7 days (decided by the server). */
  editable: boolean;
  hasFile: boolean;
}

const MEASURE_LABEL: Record<string, string> = { hrBpm: "heart rate", powerW: "power", speedKmh: "speed" };

function errorText(e: unknown): string {
  if (e instanceof ApiError) {
    const fields = Object.values(e.fieldErrors).flat();
    return fields.length ? fields.join(" ") : e.message;
  }
  return "That did not work; please try again.";
}

/** Mark a planned session done, partly done or skipped; edit or undo it for 7 days; attach the recorded file. */
export function LogPanel({
  sessionId,
  athleteId,
  plannedMin,
  log,
  units = "metric",
}: {
  /** The reader's units: the distance is asked and shown in km or mi (stored in km). */
  units?: Units;
  sessionId: string;
  athleteId: string;
  plannedMin: number;
  log: LogView | null;
}) {
  const router = useRouter();
  const [editing, setEditing] = useState(!log);
  // Nothing is chosen before the athlete says how it went (a pre-selected "Done" would log sessions never done).
  const [status, setStatus] = useState<LogView["status"] | null>(log?.status ?? null);
  const [error, setError] = useState<string>();
  const [notice, setNotice] = useState<string>();
  const [busy, setBusy] = useState(false);
  const [progress, setProgress] = useState<number | null>(null);
  // The choice of done, partial or skipped is the page's state: it can only be made once the page's script runs.
  const hydrated = useHydrated();
  const editable = log ? log.editable : true;

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (busy) return;
    if (!status) return setError("Choose how it went: done, partly done or skipped.");
    const f = new FormData(e.currentTarget);
    const num = (k: string) => (f.get(k) === "" || f.get(k) === null ? null : Number(f.get(k)));
    const body =
      status === "skipped"
        ? { status, skipReason: String(f.get("skipReason") ?? ""), notes: String(f.get("notes") ?? "") }
        : {
            status,
            durationMin: num("durationMin"),
            distanceKm: toKm(num("distanceKm"), units),
            rpe: num("rpe"),
            notes: String(f.get("notes") ?? ""),
          };
    setBusy(true);
    setError(undefined);
    try {
      if (log) await apiFetch(`/api/logs/${log.id}`, { method: "PATCH", body: JSON.stringify(body) });
      else await apiFetch(`/api/sessions/${sessionId}/log`, { method: "POST", body: JSON.stringify(body) });
      setNotice(status === "skipped" ? "Marked as skipped." : "Logged. Well done.");
      setEditing(false);
      router.refresh();
    } catch (err) {
      setError(errorText(err));
    } finally {
      setBusy(false);
    }
  }

  async function undo() {
    if (!log || busy) return;
    setBusy(true);
    try {
      await apiFetch(`/api/logs/${log.id}`, { method: "DELETE" });
      setNotice("The log was undone; the session is open again.");
      setEditing(true);
      router.refresh();
    } catch (err) {
      setError(errorText(err));
    } finally {
      setBusy(false);
    }
  }

  async function upload(file: File) {
    const form = new FormData();
    form.set("file", file);
    form.set("sessionId", sessionId);
    setError(undefined);
    setProgress(0);
    try {
      const r = await uploadWithProgress<{ timeInZone: { minutesByZone: number[] } | null; warnings: string[] }>(
        `/api/athletes/${athleteId}/activities`,
        form,
        (p) => setProgress(p * 0.9),
      );
      setProgress(1);
      setNotice(
        r.timeInZone
          ? `File read: ${r.timeInZone.minutesByZone.map((m, i) => `zone ${i + 1} ${Math.round(m)} min`).join(", ")}.${r.warnings.length ? ` ${r.warnings.join(" ")}` : ""}`
          : `File read. ${r.warnings.join(" ")}`,
      );
      router.refresh();
    } catch (err) {
      setError(errorText(err));
    } finally {
      setProgress(null);
    }
  }

  return (
    <div className="space-y-2">
      {notice ? <FormNotice>{notice}</FormNotice> : null}
      {error ? <FormAlert>{error}</FormAlert> : null}
      {log && !editing ? (
        <div className="space-y-1 text-sm" data-testid="log-summary">
          <p>
            <span className="font-semibold">{LOG_STATUS_LABELS[log.status]}</span>
            {log.status === "skipped" ? (
              <> · {log.skipReason}</>
            ) : (
              <span className="num">
                {log.durationMin != null ? ` · ${Math.round(log.durationMin)} of ${Math.round(plannedMin)} min` : ""}
                {log.distanceKm != null ? ` · ${distanceText(log.distanceKm * 1000, units)}` : ""}
                {log.rpe != null ? ` · RPE ${log.rpe} (${anchorOf(log.rpe)})` : " · no RPE yet"}
              </span>
            )}
          </p>
          {log.measuredMinByZone ? (
            <p className="num text-ink-soft">
              Measured by {MEASURE_LABEL[log.zoneMeasure ?? ""] ?? "file"}:{" "}
              {log.measuredMinByZone.map((m, i) => `zone ${i + 1} ${Math.round(m)} min`).join(" · ")}
            </p>
          ) : null}
          {log.notes ? <p className="text-ink-soft">“{log.notes}”</p> : null}
          {editable ? (
            <p className="flex flex-wrap gap-2">
              <button type="button" className="btn-quiet py-1" onClick={() => setEditing(true)}>
                Edit the log
              </button>
              <button type="button" className="btn-quiet py-1" onClick={undo} disabled={busy}>
                Undo
              </button>
            </p>
          ) : (
            <p className="text-xs text-ink-soft">Logs can be changed for 7 days.</p>
          )}
        </div>
      ) : null}
      {editing && editable ? (
        <form onSubmit={submit} className="space-y-3 rounded-md border border-rule p-3" aria-label="Log this session">
          <fieldset className="flex flex-wrap gap-3 text-sm" disabled={!hydrated}>
            <legend className="field-label">How did it go?</legend>
            {(["done", "partial", "skipped"] as const).map((s) => (
              <label key={s} className="flex items-center gap-1">
                <input type="radio" name="status" value={s} checked={status === s} onChange={() => setStatus(s)} />{" "}
                {LOG_STATUS_LABELS[s]}
              </label>
            ))}
          </fieldset>
          {status === null ? null : status === "skipped" ? (
            <label className="block">
              <span className="field-label">Why was it skipped?</span>
              <input
                name="skipReason"
                className="field-input"
                defaultValue={log?.skipReason ?? ""}
                maxLength={500}
                required
                placeholder="Ill, travelling, no time…"
              />
            </label>
          ) : (
            <div className="grid gap-3 sm:grid-cols-3">
              <label className="block">
                <span className="field-label">Duration (min)</span>
                <input
                  name="durationMin"
                  type="number"
                  inputMode="decimal"
                  min={1}
                  max={1440}
                  step="any"
                  required
                  className="field-input num"
                  defaultValue={log?.durationMin ?? Math.round(plannedMin)}
                />
              </label>
              <label className="block">
                <span className="field-label">Distance ({units === "imperial" ? "mi" : "km"}, optional)</span>
                <input
                  name="distanceKm"
                  type="number"
                  inputMode="decimal"
                  min={0}
                  max={1000}
                  step="any"
                  className="field-input num"
                  defaultValue={log?.distanceKm != null ? distanceIn(log.distanceKm, units) : ""}
                />
              </label>
              <label className="block">
                <span className="field-label">Effort, whole session (RPE 0–10)</span>
                <select name="rpe" required className="field-input" defaultValue={log?.rpe ?? ""}>
                  <option value="" disabled>
                    Choose…
                  </option>
                  {CR10_ANCHORS.map((a) => (
                    <option key={a.value} value={a.value}>
                      {a.value} · {a.label}
                    </option>
                  ))}
                </select>
              </label>
            </div>
          )}
          <label className="block">
            <span className="field-label">Notes (optional)</span>
            <textarea name="notes" className="field-input" rows={2} maxLength={2000} defaultValue={log?.notes ?? ""} />
          </label>
          <p className="flex gap-2">
            <SubmitButton className="btn" disabled={busy}>
              {busy ? "Saving…" : log ? "Save the changes" : "Save the log"}
            </SubmitButton>
            {log ? (
              <button type="button" className="btn-quiet" onClick={() => setEditing(false)}>
                Cancel
              </button>
            ) : null}
          </p>
          <p className="text-xs text-ink-soft">Rate the session as a whole about half an hour after it ended.</p>
        </form>
      ) : null}
      {!log?.hasFile && (log?.status ?? "done") !== "skipped" ? (
        <label className="block text-sm">
          <span className="field-label">Recorded file (FIT, TCX, GPX or CSV, up to 25 MB)</span>
          <input
            type="file"
            accept=".fit,.tcx,.gpx,.csv"
            className="text-sm"
            disabled={progress !== null}
            onChange={(e) => e.target.files?.[0] && upload(e.target.files[0])}
          />
        </label>
      ) : null}
      {progress !== null ? (
        <div
          role="progressbar"
          aria-label="Uploading and reading the file"
          aria-valuemin={0}
          aria-valuemax={100}
          aria-valuenow={Math.round(progress * 100)}
          className="h-2 overflow-hidden rounded bg-ground"
        >
          <div className="h-full bg-tide transition-all" style={{ width: `${progress * 100}%` }} />
        </div>
      ) : null}
    </div>
  );
}
