"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { useSave } from "@/features/platform/components/use-save";
import { DATE_STYLES, formatDay, type DateStyle } from "@/features/platform/lib/date-format";
import { UNIT_LABELS, UNIT_SYSTEMS, type Units } from "@/features/platform/lib/units";

const DATE_STYLE_NAMES: Record<DateStyle, string> = {
  iso: "Year, month, day (ISO 8601)",
  "day-month": "Day before month",
  "month-day": "Month before day",
};

/**
 * Metric or imperial for every number the person reads (targets, zone tables, e-mails and downloads), and how dates read
 * on pages and in e-mails. Each date style is shown with an example: `example` is today's date.
 */
export function DisplaySettings({
  initial,
  example,
}: {
  initial: { units: Units; dateStyle: DateStyle };
  example: string;
}) {
  const router = useRouter();
  const [units, setUnits] = useState<Units>(initial.units);
  const [dateStyle, setDateStyle] = useState<DateStyle>(initial.dateStyle);
  const { state, busy, save } = useSave();
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        void save(async () => {
          await apiFetch("/api/me/display", { method: "PATCH", body: JSON.stringify({ units, dateStyle }) });
          router.refresh();
          return `Saved. Distances, speeds and paces read in ${units} units; dates read like ${formatDay(example, dateStyle, { weekday: true })}.`;
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
      <fieldset className="space-y-1">
        <legend className="field-label">Write dates</legend>
        {DATE_STYLES.map((d) => (
          <label key={d} className="flex items-center gap-2">
            <input type="radio" name="dateStyle" value={d} checked={dateStyle === d} onChange={() => setDateStyle(d)} />
            {DATE_STYLE_NAMES[d]}: <span className="num">{formatDay(example, d, { weekday: true })}</span>
          </label>
        ))}
      </fieldset>
      <p className="text-xs text-ink-soft">
        Pages, the calendar and e-mails follow this. Downloads keep year-month-day dates, which spreadsheets read as
        dates.
      </p>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Saving…" : "Save units and dates"}
      </SubmitButton>
    </form>
  );
}
