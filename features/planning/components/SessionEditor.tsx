"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { invalidatePlan, type SessionDto } from "../api";
import { structureSchema, type Block } from "../lib/session";
import { formSchema, fromStructure, StructureFields, toStructure, type Values } from "./TemplateBuilder";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

/**
 * Edits a planned session's title, notes and steps. For a session of a repeating series the coach chooses whether the change
 * applies to this occurrence only or to the series from this occurrence on.
 */
export function SessionEditor({
  athleteId,
  session,
  onDone,
  onCancel,
}: {
  athleteId: string;
  session: SessionDto & { structure?: Block[]; notes?: string };
  onDone: (text: string) => void;
  onCancel: () => void;
}) {
  const qc = useQueryClient();
  const blocks = session.structure ? fromStructure(session.structure) : null;
  const [scope, setScope] = useState<"one" | "series">("one");
  const { register, control, handleSubmit, formState, setError } = useForm<Values>({
    resolver: zodResolver(formSchema),
    defaultValues: {
      name: session.title,
      sport: session.sport as Values["sport"],
      description: session.notes ?? "",
      blocks: blocks ?? [{ times: 1, steps: [{ kind: "work", amount: 10, unit: "min", zone: 1 }] }],
    },
  });
  const onSubmit = handleSubmit(async (v) => {
    const body: Record<string, unknown> = {
      title: v.name,
      notes: v.description,
      scope: session.seriesId ? scope : "one",
      version: session.version,
    };
    if (blocks) {
      const s = structureSchema.safeParse(toStructure(v));
      if (!s.success) return setError("root", { message: s.error.issues[0]!.message });
      body.structure = s.data;
    }
    try {
      await apiFetch(`/api/sessions/${session.id}`, { method: "PATCH", body: JSON.stringify(body) });
      await invalidatePlan(qc, athleteId);
      onDone(`Saved "${v.name}".`);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) {
        // Someone else saved first: show their version (the calendar reloads) and keep this form's text for a retry.
        await invalidatePlan(qc, athleteId);
        return setError("root", { message: `${err.message} Close this editor to see it.` });
      }
      setError("root", { message: err instanceof Error ? err.message : "Saving failed." });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label={`Edit ${session.title}`}>
      <FormAlert>{formState.errors.root?.message}</FormAlert>
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor="ses-title" className="field-label">
            Title
          </label>
          <input id="ses-title" className="field-input" {...register("name")} />
          <FieldError id="ses-title-e" message={formState.errors.name?.message} />
        </div>
        <div>
          <label htmlFor="ses-notes" className="field-label">
            Notes for the athlete <span className="font-normal text-ink-soft">(optional)</span>
          </label>
          <input id="ses-notes" className="field-input" {...register("description")} />
        </div>
      </div>
      {blocks ? (
        <StructureFields control={control} register={register} />
      ) : (
        <p className="text-sm text-ink-soft">
          This session nests repeats inside repeats; its steps cannot be edited here. Title and notes can.
        </p>
      )}
      {session.seriesId ? (
        <fieldset className="flex flex-wrap gap-4 text-sm">
          <legend className="font-semibold">This session repeats. Apply the change to</legend>
          <label className="flex items-center gap-1">
            <input type="radio" name="ses-scope" checked={scope === "one"} onChange={() => setScope("one")} /> this
            occurrence only
          </label>
          <label className="flex items-center gap-1">
            <input type="radio" name="ses-scope" checked={scope === "series"} onChange={() => setScope("series")} /> the
            series from here on
          </label>
        </fieldset>
      ) : null}
      <div className="flex gap-2">
        <SubmitButton className="btn" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? "Saving…" : "Save the session"}
        </SubmitButton>
        <button type="button" className="btn-quiet" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}
