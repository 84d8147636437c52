"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { apiFetch, ApiError } from "@/features/platform/lib/api-client";
import { createSquadSchema } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

export function CreateSquadForm() {
  const router = useRouter();
  const { register, handleSubmit, formState, setError } = useForm<z.infer<typeof createSquadSchema>>({
    resolver: zodResolver(createSquadSchema),
  });
  const onSubmit = handleSubmit(async (values) => {
    try {
      const squad = await apiFetch<{ id: string }>("/api/squads", { method: "POST", body: JSON.stringify(values) });
      router.push(`/roster?squad=${squad.id}`);
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.fieldErrors.name) setError("name", { message: e.fieldErrors.name[0] });
      else setError("root", { message: e instanceof Error ? e.message : "The squad could not be created." });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormAlert>{formState.errors.root?.message}</FormAlert>
      <div>
        <label htmlFor="squad-name" className="field-label">
          Squad name
        </label>
        <input id="squad-name" className="field-input" aria-describedby="squad-name-error" {...register("name")} />
        <FieldError id="squad-name-error" message={formState.errors.name?.message} />
      </div>
      <SubmitButton className="btn" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Creating…" : "Create the squad"}
      </SubmitButton>
    </form>
  );
}
