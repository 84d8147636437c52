"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { ApiError } from "@/features/platform/lib/api-client";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { saveClearance } from "../api";

/** A coach records the clearance the athlete brought: who cleared, their role as written, the date, a note. */
export function ClearanceForm({ athleteId, today }: { athleteId: string; today: string }) {
  const router = useRouter();
  const [v, setV] = useState({ clearedBy: "", role: "", clearedOn: today, note: "" });
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [error, setError] = useState<string>();
  const [saved, setSaved] = useState(false);
  const [busy, setBusy] = useState(false);
  const field = (name: keyof typeof v, label: string, type = "text") => (
    <div>
      <label htmlFor={`clear-${name}`} className="field-label">
        {label}
      </label>
      <input
        id={`clear-${name}`}
        type={type}
        className="field-input"
        value={v[name]}
        aria-invalid={!!errors[name]}
        aria-describedby={`clear-${name}-e`}
        onChange={(e) => setV({ ...v, [name]: e.target.value })}
      />
      {errors[name] ? (
        <p id={`clear-${name}-e`} className="mt-1 text-sm text-alert">
          {errors[name]![0]}
        </p>
      ) : null}
    </div>
  );
  return (
    <form
      noValidate
      className="space-y-3"
      aria-labelledby="clearance-h"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setError(undefined);
        setErrors({});
        setSaved(false);
        try {
          await saveClearance(athleteId, {
            clearedBy: v.clearedBy,
            role: v.role,
            clearedOn: v.clearedOn,
            ...(v.note.trim() ? { note: v.note } : {}),
          });
          setSaved(true);
          router.refresh();
        } catch (err) {
          if (err instanceof ApiError && Object.keys(err.fieldErrors).length) setErrors(err.fieldErrors);
          else setError(err instanceof Error ? err.message : "Saving failed.");
        } finally {
          setBusy(false);
        }
      }}
    >
      <h2 id="clearance-h" className="text-lg font-bold">
        Record a clearance
      </h2>
      <p className="text-sm text-ink-soft">
        When a physician or another licensed health professional has cleared the athlete after the answers above, record
        it as they gave it. It lifts the hold for these answers; a new yes needs a new clearance.
      </p>
      <FormAlert>{error}</FormAlert>
      {saved ? <FormNotice>Clearance recorded.</FormNotice> : null}
      <div className="grid gap-3 sm:grid-cols-2">
        {field("clearedBy", "Cleared by (name)")}
        {field("role", "Their role (as they gave it)")}
        {field("clearedOn", "Date of the clearance", "date")}
        {field("note", "Note (optional, e.g. conditions given)")}
      </div>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Saving…" : "Record the clearance"}
      </SubmitButton>
    </form>
  );
}
