"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { useSave } from "@/features/platform/components/use-save";
import { UNIT_LABELS, UNIT_SYSTEMS, type Units } from "@/features/platform/lib/units";

/** Metric or imperial for every number the person reads: targets, zone tables, e-mails and downloads. */
export function UnitSettings({ initial }: { initial: Units }) {
  const router = useRouter();
  const [units, setUnits] = useState<Units>(initial);
  const { state, busy, save } = useSave();
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        void save(async () => {
          await apiFetch("/api/me/display", { method: "PATCH", body: JSON.stringify({ units }) });
          router.refresh();
          return `Saved. Distances, speeds and paces now read in ${units} units.`;
        });
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
