"use client";
import { Day, Said } from "@/features/platform/components/dates";
import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useForm, useWatch } from "react-hook-form";
import { FieldError, FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { BUDGET_PRESETS, type BudgetPreset } from "../lib/budget";
import { BLOCK_LABELS, type BlockName, type SeasonWeek } from "../lib/season";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { invalidatePlan } from "../api";

const ROLE_LABELS: Record<SeasonWeek["role"], string> = {
  loading: "Loading",
  unloading: "Unloading",
  taper: "Taper",
  event: "Event",
  recovery: "Recovery",
};

type Values = {
  block: BlockName;
  role: SeasonWeek["role"];
  volumeHours: number;
  budget: BudgetPreset;
  retest: boolean;
};

/** Edits one generated season week; what the generator proposed is only a starting point. */
export function SeasonWeekEditor({
  athleteId,
  seasonId,
  seasonVersion,
  week,
}: {
  athleteId: string;
  seasonId: string;
  seasonVersion: number;
  week: SeasonWeek;
}) {
  const router = useRouter();
  const qc = useQueryClient();
  const { register, handleSubmit, formState, setError, control } = useForm<Values>({
    defaultValues: {
      block: week.block,
      role: week.role,
      volumeHours: week.volumeHours,
      budget: week.budget,
      retest: week.retest,
    },
  });
  const chosenBudget = useWatch({ control, name: "budget" });
  const onSubmit = handleSubmit(async (v) => {
    if (!(v.volumeHours >= 0 && v.volumeHours <= 40))
      return setError("volumeHours", { message: "Give 0 to 40 hours." });
    try {
      await apiFetch(`/api/seasons/${seasonId}/weeks/${week.weekStart}`, {
        method: "PATCH",
        body: JSON.stringify({ ...v, version: seasonVersion }),
      });
      await invalidatePlan(qc, athleteId);
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.status === 409) {
        // Someone else saved the season first: the page reloads with their version (this form then starts from it).
        router.refresh();
        return setError("root", { message: `${e.message} The page has been reloaded.` });
      }
      setError("root", { message: e instanceof Error ? e.message : "Saving failed." });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-labelledby="week-edit-h">
      <h2 id="week-edit-h" className="font-bold">
        Week of <Day value={week.weekStart} />
        {week.events.length ? ` · ${week.events.join(", ")}` : ""}
      </h2>
      <FormAlert>{formState.errors.root?.message}</FormAlert>
      {formState.isSubmitSuccessful && !formState.errors.root ? <FormNotice>Week saved.</FormNotice> : null}
      <div className="grid gap-3 sm:grid-cols-5">
        <label className="block">
          <span className="field-label">Block</span>
          <select className="field-input" {...register("block")}>
            {Object.entries(BLOCK_LABELS).map(([k, l]) => (
              <option key={k} value={k}>
                {l}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Role</span>
          <select className="field-input" {...register("role")}>
            {Object.entries(ROLE_LABELS).map(([k, l]) => (
              <option key={k} value={k}>
                {l}
              </option>
            ))}
          </select>
        </label>
        <label className="block">
          <span className="field-label">Volume target (h)</span>
          <input
            type="number"
            step="0.5"
            min={0}
            max={40}
            className="field-input num"
            {...register("volumeHours", { valueAsNumber: true })}
          />
          <FieldError id="week-vol-e" message={formState.errors.volumeHours?.message} />
        </label>
        <label className="block">
          <span className="field-label">Intensity budget</span>
          <select className="field-input" {...register("budget")}>
            {Object.entries(BUDGET_PRESETS).map(([k, b]) => (
              <option key={k} value={k}>
                {b.name} ({b.shares.map((x) => Math.round(x * 100)).join(" / ")} %,{" "}
                {b.counting === "session" ? "by session" : "by time"})
              </option>
            ))}
          </select>
          <span className="mt-1 block text-xs text-ink-soft" data-testid="budget-source">
            {BUDGET_PRESETS[chosenBudget as BudgetPreset]?.source}
          </span>
        </label>
        <label className="flex items-center gap-2 self-end pb-2">
          <input type="checkbox" {...register("retest")} /> Retest this week
        </label>
      </div>
      {week.retest && week.retestNote ? (
        <p className="text-sm text-ink-soft">
          <Said>{week.retestNote}</Said>
        </p>
      ) : null}
      {week.role === "taper" || week.role === "event" || week.role === "recovery" ? (
        <p className="text-sm text-ink-soft">
          A retest in a {week.role === "event" ? "race" : week.role} week would cost the event or measure a tired
          athlete: the generator never places one here.
        </p>
      ) : null}
      <SubmitButton className="btn" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Save the week"}
      </SubmitButton>
    </form>
  );
}
