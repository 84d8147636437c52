"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { UNIT_LABELS, UNIT_SYSTEMS, type Units } from "@/features/platform/lib/units";

/** Metric or imperial for every number the person reads: targets, zone tables, e-mails and downloads. */
export function UnitSettings({ initial }: { initial: Units }) {
  const router = useRouter();
  const [units, setUnits] = useState<Units>(initial);
  const [state, setState] = useState<{ kind: "ok" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <form
      className="space-y-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setState(null);
        try {
          await apiFetch("/api/me/display", { method: "PATCH", body: JSON.stringify({ units }) });
          setState({ kind: "ok", text: `Saved. Distances, speeds and paces now read in ${units} units.` });
          router.refresh();
        } catch (err) {
          setState({ kind: "error", text: err instanceof Error ? err.message : "Saving failed." });
        } finally {
          setBusy(false);
        }
      }}
    >
      {state ? state.kind === "ok" ? <FormNotice>{state.text}</FormNotice> : <FormAlert>{state.text}</FormAlert> : null}
      <fieldset className="space-y-1">
        <legend className="field-label">Show distances, speeds and paces in</legend>
        {UNIT_SYSTEMS.map((u) => (
          <label key={u} className="flex items-center gap-2">
            <input type="radio" name="units" value={u} checked={units === u} onChange={() => setUnits(u)} />
            {UNIT_LABELS[u]}
          </label>
        ))}
      </fieldset>
      <p className="text-xs text-ink-soft">
        Each sport keeps its own way of saying how fast: pace for running, walking and skiing, speed for cycling, the
        split per 500 m for rowing, and pace per 100 m or 100 yd for swimming.
      </p>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Saving…" : "Save units"}
      </SubmitButton>
    </form>
  );
}
