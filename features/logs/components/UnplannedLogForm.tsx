"use client";
import { toKm, type Units } from "@/features/platform/lib/units";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { SPORT_LABELS, SPORTS } from "@/features/platform/lib/sports";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { CR10_ANCHORS } from "../lib/cr10";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

/** Log a session that was not planned. One key per form: sending it twice still gives one log. */
export function UnplannedLogForm({
  athleteId,
  today,
  defaultSport,
  units = "metric",
}: {
  athleteId: string;
  today: string;
  defaultSport: string;
  /** The reader's units: the distance is asked in km or mi (stored in km). */
  units?: Units;
}) {
  const router = useRouter();
  const [key, setKey] = useState(() => crypto.randomUUID());
  const [error, setError] = useState<string>();
  const [notice, setNotice] = useState<string>();
  const [busy, setBusy] = useState(false);

  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (busy) return;
    const form = e.currentTarget;
    const f = new FormData(form);
    const num = (k: string) => (f.get(k) === "" ? null : Number(f.get(k)));
    setBusy(true);
    setError(undefined);
    try {
      await apiFetch(`/api/athletes/${athleteId}/logs`, {
        method: "POST",
        body: JSON.stringify({
          status: "done",
          clientKey: key,
          date: f.get("date"),
          sport: f.get("sport"),
          title: f.get("title"),
          durationMin: num("durationMin"),
          distanceKm: toKm(num("distanceKm"), units),
          rpe: num("rpe"),
          notes: String(f.get("notes") ?? ""),
        }),
      });
      setNotice("Logged.");
      form.reset();
      setKey(crypto.randomUUID());
      router.refresh();
    } catch (err) {
      setError(
        err instanceof ApiError
          ? [err.message, ...Object.values(err.fieldErrors).flat()].join(" ")
          : "That did not work; please try again.",
      );
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="space-y-3" aria-label="Log an unplanned session">
      {notice ? <FormNotice>{notice}</FormNotice> : null}
      {error ? <FormAlert>{error}</FormAlert> : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="block">
          <span className="field-label">Title</span>
          <input name="title" required maxLength={80} className="field-input" placeholder="Easy spin with the club" />
        </label>
        <label className="block">
          <span className="field-label">Day</span>
          <input name="date" type="date" required defaultValue={today} max={today} className="field-input num" />
        </label>
        <label className="block">
          <span className="field-label">Sport</span>
          <select name="sport" className="field-input" defaultValue={defaultSport}>
            {SPORTS.map((s) => (
              <option key={s} value={s}>
                {SPORT_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Duration (min)</span>
          <input name="durationMin" type="number" min={1} max={1440} step="any" required className="field-input num" />
        </label>
        <label className="block">
          <span className="field-label">Distance ({units === "imperial" ? "mi" : "km"}, optional)</span>
          <input name="distanceKm" type="number" min={0} max={1000} step="any" className="field-input num" />
        </label>
        <label className="block">
          <span className="field-label">Effort, whole session (RPE 0–10)</span>
          <select name="rpe" required className="field-input" defaultValue="">
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
      <label className="block">
        <span className="field-label">Notes (optional)</span>
        <textarea name="notes" rows={2} maxLength={2000} className="field-input" />
      </label>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Saving…" : "Log the session"}
      </SubmitButton>
    </form>
  );
}
