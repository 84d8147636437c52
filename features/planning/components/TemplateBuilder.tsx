"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useFieldArray, useForm, useWatch, type Control, type UseFormRegister } from "react-hook-form";
import { z } from "zod";
import { SPORT_LABELS, SPORTS } from "@/features/platform/lib/sports";
import { FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";
import { expand, STEP_KINDS, structureSchema, type Block } from "../lib/session";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

const KIND_LABELS: Record<(typeof STEP_KINDS)[number], string> = {
  warmup: "Warm-up",
  work: "Work",
  recovery: "Recovery",
  cooldown: "Cool-down",
};
const ZONE_FILL = ["var(--color-zone-1)", "var(--color-zone-2)", "var(--color-zone-3)"];

const stepForm = z.object({
  kind: z.enum(STEP_KINDS),
  amount: z.number({ error: "How long?" }).positive("Above 0.").max(600, "At most 600."),
  unit: z.enum(["min", "km"]),
  zone: z.number().int().min(1).max(3),
});
const blockForm = z.object({
  times: z.number({ error: "How often?" }).int().min(1, "At least once.").max(50, "At most 50."),
  steps: z.array(stepForm).min(1),
});
export const formSchema = z.object({
  name: z.string().trim().min(2, "Name the template."),
  sport: z.enum(SPORTS),
  description: z.string().max(500),
  blocks: z.array(blockForm).min(1, "Add at least one step."),
});
export type Values = z.infer<typeof formSchema>;
type BlockValues = Values["blocks"][number];

export function toStructure(v: Pick<Values, "blocks">): Block[] {
  const out: Block[] = [];
  for (const b of v.blocks) {
    const steps = b.steps.map((st) => {
      const amount = Number(st.amount) || 0;
      const zone = Number(st.zone) || 1;
      return st.unit === "km"
        ? { type: "step" as const, kind: st.kind, distanceM: Math.round(amount * 1000), zone }
        : { type: "step" as const, kind: st.kind, durationS: Math.round(amount * 60), zone };
    });
    if (b.times > 1) out.push({ type: "repeat", times: b.times, steps });
    else out.push(...steps);
  }
  return out;
}

/**
 * The form's blocks from a saved structure: plain steps in a row become one block done once, a repeat group one block.
 * Null when the structure nests repeats inside repeats, which this form cannot show.
 */
export function fromStructure(structure: Block[]): BlockValues[] | null {
  const out: BlockValues[] = [];
  const stepOf = (b: Block) =>
    b.type === "step"
      ? {
          kind: b.kind,
          amount: b.distanceM !== undefined ? b.distanceM / 1000 : (b.durationS ?? 0) / 60,
          unit: (b.distanceM !== undefined ? "km" : "min") as "km" | "min",
          zone: b.zone,
        }
      : null;
  for (const b of structure) {
    if (b.type === "repeat") {
      const steps = b.steps.map(stepOf);
      if (steps.some((x) => x === null)) return null;
      out.push({ times: b.times, steps: steps as BlockValues["steps"] });
    } else {
      const last = out.at(-1);
      if (last && last.times === 1) last.steps.push(stepOf(b)!);
      else out.push({ times: 1, steps: [stepOf(b)!] });
    }
  }
  return out;
}

export function SessionProfile({ structure }: { structure: Block[] }) {
  const e = expand(structure);
  const total = e.totalS || 1;
  const starts = e.steps.reduce<number[]>(
    (acc, s, i) => [...acc, (acc[i] ?? 0) + ((s.durationS ?? 0) / total) * 300],
    [0],
  );
  return (
    <svg
      viewBox="0 0 300 40"
      className="h-10 w-full"
      role="img"
      aria-label={`Session profile: ${Math.round(e.totalS / 60)} min, zone 1 ${Math.round(e.minutesByZone[0])}, zone 2 ${Math.round(e.minutesByZone[1])}, zone 3 ${Math.round(e.minutesByZone[2])} min`}
    >
      {e.steps.map((s, i) => {
        const w = starts[i + 1]! - starts[i]!;
        const h = 10 + (s.zone - 1) * 14;
        return (
          <rect
            key={i}
            x={starts[i]}
            y={40 - h}
            width={Math.max(0.5, w - 0.5)}
            height={h}
            fill={ZONE_FILL[s.zone - 1]}
            stroke="var(--color-ink)"
            strokeWidth={0.3}
          />
        );
      })}
    </svg>
  );
}

function StepsEditor({
  control,
  register,
  index,
}: {
  control: Control<Values>;
  register: UseFormRegister<Values>;
  index: number;
}) {
  const { fields, append, remove } = useFieldArray({ control, name: `blocks.${index}.steps` });
  return (
    <div className="space-y-1">
      {fields.map((f, j) => (
        <div key={f.id} className="flex flex-wrap items-center gap-2">
          <select
            aria-label={`Block ${index + 1} step ${j + 1} kind`}
            className="field-input mt-0 w-32"
            {...register(`blocks.${index}.steps.${j}.kind`)}
          >
            {STEP_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_LABELS[k]}
              </option>
            ))}
          </select>
          <input
            aria-label={`Block ${index + 1} step ${j + 1} amount`}
            type="number"
            step="0.5"
            className="field-input mt-0 w-24 num"
            {...register(`blocks.${index}.steps.${j}.amount`, { valueAsNumber: true })}
          />
          <select
            aria-label={`Block ${index + 1} step ${j + 1} unit`}
            className="field-input mt-0 w-20"
            {...register(`blocks.${index}.steps.${j}.unit`)}
          >
            <option value="min">min</option>
            <option value="km">km</option>
          </select>
          <span className="text-sm">in</span>
          <select
            aria-label={`Block ${index + 1} step ${j + 1} zone`}
            className="field-input mt-0 w-28"
            {...register(`blocks.${index}.steps.${j}.zone`, { valueAsNumber: true })}
          >
            {[1, 2, 3].map((z) => (
              <option key={z} value={z}>
                zone {z}
              </option>
            ))}
          </select>
          <button
            type="button"
            className="text-sm text-alert underline"
            onClick={() => remove(j)}
            disabled={fields.length <= 1}
          >
            Remove step
          </button>
        </div>
      ))}
      <button
        type="button"
        className="text-sm text-tide underline"
        onClick={() => append({ kind: "recovery", amount: 3, unit: "min", zone: 1 })}
      >
        Add a step to this block
      </button>
    </div>
  );
}

/** The blocks of a session or template with their steps, and the live totals and profile while editing. */
export function StructureFields({
  control,
  register,
}: {
  control: Control<Values>;
  register: UseFormRegister<Values>;
}) {
  const { fields, append, remove } = useFieldArray({ control, name: "blocks" });
  const blocks = useWatch({ control, name: "blocks" });
  const structure = toStructure({ blocks: blocks ?? [] });
  const valid = structureSchema.safeParse(structure);
  const e = valid.success ? expand(valid.data) : null;
  return (
    <>
      <ol className="space-y-3">
        {fields.map((f, i) => (
          <li key={f.id} className="rounded-md border border-rule p-3">
            <div className="mb-2 flex flex-wrap items-center gap-2 text-sm">
              <span className="font-semibold">Block {i + 1}: repeat</span>
              <input
                aria-label={`Block ${i + 1} repeats`}
                type="number"
                className="field-input mt-0 w-20 num"
                {...register(`blocks.${i}.times`, { valueAsNumber: true })}
              />
              <span>× (once = plain steps)</span>
              <button
                type="button"
                className="ml-auto text-alert underline"
                onClick={() => remove(i)}
                disabled={fields.length <= 1}
              >
                Remove block
              </button>
            </div>
            <StepsEditor control={control} register={register} index={i} />
          </li>
        ))}
      </ol>
      <button
        type="button"
        className="btn-quiet"
        onClick={() => append({ times: 1, steps: [{ kind: "work", amount: 10, unit: "min", zone: 1 }] })}
      >
        Add a block
      </button>
      <div className="rounded-md bg-ground p-3 text-sm" aria-live="polite">
        {e ? (
          <>
            <p className="num font-semibold">
              {Math.round(e.totalS / 60)} min in all · zone 1 {Math.round(e.minutesByZone[0])} min · zone 2{" "}
              {Math.round(e.minutesByZone[1])} min · zone 3 {Math.round(e.minutesByZone[2])} min
            </p>
            <SessionProfile structure={valid.success ? valid.data : []} />
          </>
        ) : (
          <p className="text-alert">{valid.success ? "" : valid.error.issues[0]?.message}</p>
        )}
      </div>
    </>
  );
}

/** A saved template opened in the builder to be changed. */
export interface TemplateToEdit {
  id: string;
  version: number;
  name: string;
  sport: string;
  description: string;
  structure: Block[];
}

export function TemplateBuilder({
  squadId,
  editing,
  onDone,
}: {
  squadId: string;
  editing?: TemplateToEdit | null;
  onDone?: () => void;
}) {
  const router = useRouter();
  const editBlocks = editing ? fromStructure(editing.structure) : null;
  const { register, control, handleSubmit, formState, setError, reset } = useForm<Values>({
    resolver: zodResolver(formSchema),
    defaultValues:
      editing && editBlocks
        ? {
            name: editing.name,
            sport: (SPORTS as readonly string[]).includes(editing.sport)
              ? (editing.sport as Values["sport"])
              : "running",
            description: editing.description,
            blocks: editBlocks,
          }
        : {
            name: "",
            sport: "running",
            description: "",
            blocks: [
              { times: 1, steps: [{ kind: "warmup", amount: 15, unit: "min", zone: 1 }] },
              {
                times: 5,
                steps: [
                  { kind: "work", amount: 4, unit: "min", zone: 3 },
                  { kind: "recovery", amount: 3, unit: "min", zone: 1 },
                ],
              },
              { times: 1, steps: [{ kind: "cooldown", amount: 10, unit: "min", zone: 1 }] },
            ],
          },
  });
  const onSubmit = handleSubmit(async (v) => {
    const s = structureSchema.safeParse(toStructure(v));
    if (!s.success) return setError("root", { message: s.error.issues[0]!.message });
    try {
      if (editing) {
        await apiFetch(`/api/templates/${encodeURIComponent(editing.id)}`, {
          method: "PATCH",
          body: JSON.stringify({
            name: v.name,
            sport: v.sport,
            description: v.description,
            structure: s.data,
            version: editing.version,
          }),
        });
      } else {
        await apiFetch("/api/templates", {
          method: "POST",
          body: JSON.stringify({
            squadId,
            name: v.name,
            sport: v.sport,
            description: v.description,
            structure: s.data,
          }),
        });
        reset();
      }
      router.refresh();
      onDone?.();
    } catch (err) {
      setError("root", { message: err instanceof Error ? err.message : "Saving failed." });
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormAlert>{formState.errors.root?.message}</FormAlert>
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor="tpl-name" className="field-label">
            Name
          </label>
          <input id="tpl-name" className="field-input" {...register("name")} />
          <FieldError id="tpl-name-e" message={formState.errors.name?.message} />
        </div>
        <div>
          <label htmlFor="tpl-sport" className="field-label">
            Sport
          </label>
          <select id="tpl-sport" className="field-input" {...register("sport")}>
            {SPORTS.map((s) => (
              <option key={s} value={s}>
                {SPORT_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div className="sm:col-span-2">
          <label htmlFor="tpl-desc" className="field-label">
            Description <span className="font-normal text-ink-soft">(optional)</span>
          </label>
          <input id="tpl-desc" className="field-input" {...register("description")} />
        </div>
      </div>
      {editing && !editBlocks ? (
        <p className="text-sm text-alert">
          This template nests repeats inside repeats, which the builder cannot show; duplicate it and rebuild the steps
          instead.
        </p>
      ) : null}
      <StructureFields control={control} register={register} />
      <div className="flex flex-wrap gap-2">
        <SubmitButton className="btn" disabled={formState.isSubmitting || (!!editing && !editBlocks)}>
          {formState.isSubmitting ? "Saving…" : editing ? "Save the changes" : "Save the template"}
        </SubmitButton>
        {editing ? (
          <button type="button" className="btn-quiet" onClick={() => onDone?.()}>
            Stop editing
          </button>
        ) : null}
      </div>
    </form>
  );
}
