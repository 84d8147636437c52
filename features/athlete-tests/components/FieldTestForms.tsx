"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useFieldArray, useForm, useWatch } from "react-hook-form";
import { z } from "zod";
import { SPEECH } from "@/features/field-tests/lib/talk-test";
import { FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { ApiError } from "@/features/platform/lib/api-client";
import { createJsonTest } from "../api";
import { testMetaSchema } from "../schemas";
import { MetaFields } from "./MetaFields";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

const num = (v: unknown) => (v === "" || v == null ? null : Number(v));
const SPEECH_LABELS: Record<(typeof SPEECH)[number], string> = {
  comfortable: "Comfortable: could talk easily",
  not_fully_comfortable: "Not fully comfortable",
  cannot_speak: "Cannot speak comfortably",
};

function useSubmitter(athleteId: string, setError: (name: "root", e: { message: string }) => void) {
  const router = useRouter();
  return async (body: unknown) => {
    try {
      const { id } = await createJsonTest(athleteId, body);
      router.push(`/tests/${id}`);
      router.refresh();
    } catch (e) {
      const fields =
        e instanceof ApiError
          ? Object.entries(e.fieldErrors)
              .map(([k, v]) => `${k}: ${v[0]}`)
              .join("; ")
          : "";
      setError("root", {
        message: `${e instanceof Error ? e.message : "Saving failed."}${fields ? ` (${fields})` : ""}`,
      });
    }
  };
}

// ---------------------------------------------------------------------------------------------------------------------

const talkForm = z.object({
  meta: testMetaSchema,
  workloadUnit: z.enum(["W", "km/h"]),
  fiveZones: z.boolean(),
  stages: z
    .array(
      z.object({
        workload: z.number({ error: "Enter the workload." }).positive("The workload must be above 0."),
        durationMin: z.number({ error: "Enter minutes." }).min(0.5, "At least 0.5 min.").max(30, "At most 30 min."),
        hrBpm: z
          .number({ error: "Enter the heart rate." })
          .int("Whole beats per minute.")
          .min(40, "At least 40 bpm.")
          .max(240, "At most 240 bpm."),
        speech: z.enum(SPEECH, { error: "Choose how speaking felt." }),
      }),
    )
    .min(2, "Enter at least two stages."),
});
type TalkValues = z.infer<typeof talkForm>;

export function TalkTestForm({ athleteId, today }: { athleteId: string; today: string }) {
  const { register, control, handleSubmit, formState, setError } = useForm<TalkValues>({
    resolver: zodResolver(talkForm),
    defaultValues: {
      meta: { sport: "running", protocol: "talk test, 3-min stages", date: today, endedBy: "plan", stopSign: null },
      workloadUnit: "km/h",
      fiveZones: false,
      stages: [8, 9, 10, 11, 12].map((w) => ({
        workload: w,
        durationMin: 3,
        hrBpm: NaN as unknown as number,
        speech: "comfortable" as const,
      })),
    },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "stages" });
  const submit = useSubmitter(athleteId, setError);
  const unit = useWatch({ control, name: "workloadUnit" });
  const stagesNow = useWatch({ control, name: "stages" });
  const onSubmit = handleSubmit((v) =>
    submit({
      kind: "talk",
      meta: v.meta,
      fiveZones: v.fiveZones,
      talk: {
        workloadUnit: v.workloadUnit,
        stages: v.stages.map((s) => ({
          workload: s.workload,
          durationS: Math.round(s.durationMin * 60),
          hrBpm: s.hrBpm,
          speech: s.speech,
        })),
      },
    }),
  );
  const se = formState.errors.stages;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <FormAlert>{formState.errors.root?.message}</FormAlert>
      <MetaFields
        register={register}
        errors={formState.errors}
        endedBy={useWatch({ control, name: "meta.endedBy" })}
        protocolHint="for example: treadmill 1 km/h every 3 min"
      />
      <div className="flex flex-wrap items-end gap-6">
        <div>
          <label htmlFor="workloadUnit" className="field-label">
            Workload in
          </label>
          <select id="workloadUnit" className="field-input" {...register("workloadUnit")}>
            <option value="km/h">Speed (km/h)</option>
            <option value="W">Power (W)</option>
          </select>
        </div>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("fiveZones")} /> Also show five zones
        </label>
      </div>
      <fieldset>
        <legend className="text-lg font-bold">Stages</legend>
        <p className="text-sm text-ink-soft">
          At the end of each stage, ask the athlete to speak a standard passage aloud (about 30 words), then record the
          heart rate and how speaking felt. Stages of about 3 minutes let heart rate settle.
        </p>
        <table className="mt-2 w-full text-left text-sm">
          <thead>
            <tr className="text-ink-soft">
              <th scope="col" className="py-1 pr-2">
                Stage
              </th>
              <th scope="col" className="py-1 pr-2">
                Workload ({unit})
              </th>
              <th scope="col" className="py-1 pr-2">
                Duration (min)
              </th>
              <th scope="col" className="py-1 pr-2">
                Heart rate (bpm)
              </th>
              <th scope="col" className="py-1 pr-2">
                Speech
              </th>
              <th scope="col" className="py-1">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {fields.map((f, i) => (
              <tr key={f.id} className="align-top">
                <td className="py-1 pr-2 num">{i + 1}</td>
                <td className="py-1 pr-2">
                  <input
                    aria-label={`Stage ${i + 1} workload (${unit})`}
                    type="number"
                    step="0.1"
                    className="field-input mt-0 num"
                    {...register(`stages.${i}.workload`, { setValueAs: num })}
                  />
                  <FieldError id={`s${i}w`} message={se?.[i]?.workload?.message} />
                </td>
                <td className="py-1 pr-2">
                  <input
                    aria-label={`Stage ${i + 1} duration (min)`}
                    type="number"
                    step="0.5"
                    className="field-input mt-0 num"
                    {...register(`stages.${i}.durationMin`, { setValueAs: num })}
                  />
                  <FieldError id={`s${i}d`} message={se?.[i]?.durationMin?.message} />
                </td>
                <td className="py-1 pr-2">
                  <input
                    aria-label={`Stage ${i + 1} heart rate (bpm)`}
                    type="number"
                    className="field-input mt-0 num"
                    {...register(`stages.${i}.hrBpm`, { setValueAs: num })}
                  />
                  <FieldError id={`s${i}h`} message={se?.[i]?.hrBpm?.message} />
                </td>
                <td className="py-1 pr-2">
                  <select
                    aria-label={`Stage ${i + 1} speech`}
                    className="field-input mt-0"
                    {...register(`stages.${i}.speech`)}
                  >
                    {SPEECH.map((s) => (
                      <option key={s} value={s}>
                        {SPEECH_LABELS[s]}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="py-1">
                  <button
                    type="button"
                    className="text-sm text-alert underline"
                    onClick={() => remove(i)}
                    disabled={fields.length <= 2}
                  >
                    Remove
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <FieldError id="stages-error" message={se?.message ?? se?.root?.message} />
        <button
          type="button"
          className="btn-quiet mt-2"
          onClick={() => {
            // A new stage starts from the last one: its length and answer (the athlete changes what differs).
            const last = stagesNow?.at(-1);
            append({
              workload: NaN as unknown as number,
              durationMin: last?.durationMin ?? 3,
              hrBpm: NaN as unknown as number,
              speech: last?.speech ?? "comfortable",
            });
          }}
        >
          Add a stage
        </button>
      </fieldset>
      <SubmitButton className="btn" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Save the talk test"}
      </SubmitButton>
    </form>
  );
}

// ---------------------------------------------------------------------------------------------------------------------

const submaxForm = z.object({
  meta: testMetaSchema,
  modality: z.enum(["cycling", "arm", "running", "walking"]),
  massKg: z
    .number({ error: "Enter body mass in kg." })
    .gt(20, "Body mass must be above 20 kg.")
    .lt(300, "Body mass must be below 300 kg."),
  age: z.number().int().min(10, "Age at least 10.").max(100, "Age at most 100.").nullable(),
  measuredHrMaxBpm: z.number().int().min(100, "At least 100 bpm.").max(240, "At most 240 bpm.").nullable(),
  hrMaxFormula: z.enum(["tanaka", "gellish", "traditional"]),
  stages: z
    .array(
      z.object({
        load: z.number({ error: "Enter the workload." }).positive("Above 0."),
        gradePct: z.number().min(0).max(40),
        hrBpm: z
          .number({ error: "Enter the steady heart rate." })
          .int()
          .min(50, "At least 50 bpm.")
          .max(230, "At most 230 bpm."),
        hrBpmMinuteBefore: z.number().int().min(50, "At least 50 bpm.").max(230, "At most 230 bpm.").nullable(),
      }),
    )
    .min(2, "Enter at least two stages."),
});
type SubmaxValues = z.infer<typeof submaxForm>;

export function SubmaxForm({
  athleteId,
  today,
  massKg,
  age,
}: {
  athleteId: string;
  today: string;
  massKg: number | null;
  age: number | null;
}) {
  const { register, control, handleSubmit, formState, setError } = useForm<SubmaxValues>({
    resolver: zodResolver(submaxForm),
    defaultValues: {
      meta: {
        sport: "cycling",
        protocol: "three 4-min submaximal stages",
        date: today,
        endedBy: "plan",
        stopSign: null,
      },
      modality: "cycling",
      massKg: massKg ?? (NaN as unknown as number),
      age,
      measuredHrMaxBpm: null,
      hrMaxFormula: "tanaka",
      stages: [50, 100, 150].map((load) => ({
        load,
        gradePct: 0,
        hrBpm: NaN as unknown as number,
        hrBpmMinuteBefore: null,
      })),
    },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "stages" });
  const submit = useSubmitter(athleteId, setError);
  const modality = useWatch({ control, name: "modality" });
  const powered = modality === "cycling" || modality === "arm";
  const onSubmit = handleSubmit((v) =>
    submit({
      kind: "submax",
      meta: v.meta,
      submax: {
        modality: v.modality,
        massKg: v.massKg,
        age: v.age,
        measuredHrMaxBpm: v.measuredHrMaxBpm,
        hrMaxFormula: v.hrMaxFormula,
        stages: v.stages.map((s) =>
          v.modality === "cycling" || v.modality === "arm"
            ? { powerW: s.load, hrBpm: s.hrBpm, hrBpmMinuteBefore: s.hrBpmMinuteBefore }
            : { speedKmh: s.load, gradePct: s.gradePct, hrBpm: s.hrBpm, hrBpmMinuteBefore: s.hrBpmMinuteBefore },
        ),
      },
    }),
  );
  const e = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <FormAlert>{e.root?.message}</FormAlert>
      <MetaFields
        register={register}
        errors={e}
        endedBy={useWatch({ control, name: "meta.endedBy" })}
        protocolHint="for example: cycle ergometer, 4-min stages"
      />
      <div className="grid gap-4 sm:grid-cols-3">
        <div>
          <label htmlFor="modality" className="field-label">
            Exercise
          </label>
          <select id="modality" className="field-input" {...register("modality")}>
            <option value="cycling">Leg cycling</option>
            <option value="arm">Arm cranking</option>
            <option value="running">Running</option>
            <option value="walking">Walking</option>
          </select>
        </div>
        <div>
          <label htmlFor="massKg" className="field-label">
            Body mass (kg)
          </label>
          <input
            id="massKg"
            type="number"
            step="0.1"
            className="field-input num"
            {...register("massKg", { setValueAs: num })}
          />
          <FieldError id="massKg-error" message={e.massKg?.message} />
        </div>
        <div>
          <label htmlFor="age" className="field-label">
            Age (years)
          </label>
          <input id="age" type="number" className="field-input num" {...register("age", { setValueAs: num })} />
          <FieldError id="age-error" message={e.age?.message} />
        </div>
        <div>
          <label htmlFor="measuredHrMaxBpm" className="field-label">
            Measured HRmax (bpm, optional)
          </label>
          <input
            id="measuredHrMaxBpm"
            type="number"
            className="field-input num"
            {...register("measuredHrMaxBpm", { setValueAs: num })}
          />
          <FieldError id="measuredHrMaxBpm-error" message={e.measuredHrMaxBpm?.message} />
        </div>
        <div className="sm:col-span-2">
          <label htmlFor="hrMaxFormula" className="field-label">
            Otherwise predict HRmax with
          </label>
          <select id="hrMaxFormula" className="field-input" {...register("hrMaxFormula")}>
            <option value="tanaka">Tanaka, Monahan &amp; Seals 2001: 208 − 0.7 × age</option>
            <option value="gellish">Gellish et al. 2007: 207 − 0.7 × age</option>
            <option value="traditional">220 − age</option>
          </select>
        </div>
      </div>
      <fieldset>
        <legend className="text-lg font-bold">Steady stages</legend>
        <table className="mt-2 w-full text-left text-sm">
          <thead>
            <tr className="text-ink-soft">
              <th scope="col" className="py-1 pr-2">
                Stage
              </th>
              <th scope="col" className="py-1 pr-2">
                {powered ? "Power (W)" : "Speed (km/h)"}
              </th>
              {!powered ? (
                <th scope="col" className="py-1 pr-2">
                  Grade (%)
                </th>
              ) : null}
              <th scope="col" className="py-1 pr-2">
                Heart rate at the end (bpm)
              </th>
              <th scope="col" className="py-1 pr-2">
                One minute before (bpm, optional)
              </th>
              <th scope="col">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {fields.map((f, i) => (
              <tr key={f.id} className="align-top">
                <td className="py-1 pr-2 num">{i + 1}</td>
                <td className="py-1 pr-2">
                  <input
                    aria-label={`Stage ${i + 1} ${powered ? "power (W)" : "speed (km/h)"}`}
                    type="number"
                    step="0.1"
                    className="field-input mt-0 num"
                    {...register(`stages.${i}.load`, { setValueAs: num })}
                  />
                  <FieldError id={`m${i}l`} message={e.stages?.[i]?.load?.message} />
                </td>
                {!powered ? (
                  <td className="py-1 pr-2">
                    <input
                      aria-label={`Stage ${i + 1} grade (%)`}
                      type="number"
                      step="0.5"
                      className="field-input mt-0 num"
                      {...register(`stages.${i}.gradePct`, { setValueAs: (v) => num(v) ?? 0 })}
                    />
                  </td>
                ) : null}
                <td className="py-1 pr-2">
                  <input
                    aria-label={`Stage ${i + 1} heart rate (bpm)`}
                    type="number"
                    className="field-input mt-0 num"
                    {...register(`stages.${i}.hrBpm`, { setValueAs: num })}
                  />
                  <FieldError id={`m${i}h`} message={e.stages?.[i]?.hrBpm?.message} />
                </td>
                <td className="py-1 pr-2">
                  <input
                    aria-label={`Stage ${i + 1} heart rate one minute before its end (bpm)`}
                    type="number"
                    className="field-input mt-0 num"
                    {...register(`stages.${i}.hrBpmMinuteBefore`, { setValueAs: num })}
                  />
                  <FieldError id={`m${i}p`} message={e.stages?.[i]?.hrBpmMinuteBefore?.message} />
                </td>
                <td className="py-1">
                  <button
                    type="button"
                    className="text-sm text-alert underline"
                    onClick={() => remove(i)}
                    disabled={fields.length <= 2}
                  >
                    Remove
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        <button
          type="button"
          className="btn-quiet mt-2"
          onClick={() =>
            append({
              load: NaN as unknown as number,
              gradePct: 0,
              hrBpm: NaN as unknown as number,
              hrBpmMinuteBefore: null,
            })
          }
        >
          Add a stage
        </button>
      </fieldset>
      <SubmitButton className="btn" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Estimating…" : "Estimate VO2max"}
      </SubmitButton>
    </form>
  );
}

// ---------------------------------------------------------------------------------------------------------------------

const pointSchema = z.object({
  hrBpm: z.number().int().min(60).max(230).nullable(),
  powerW: z.number().positive().max(2500).nullable(),
  speedKmh: z.number().positive().max(45).nullable(),
});
const manualForm = z.object({ meta: testMetaSchema, vt1: pointSchema, vt2: pointSchema, fiveZones: z.boolean() });
type ManualValues = z.infer<typeof manualForm>;

export function ManualThresholdsForm({ athleteId, today }: { athleteId: string; today: string }) {
  const { register, control, handleSubmit, formState, setError } = useForm<ManualValues>({
    resolver: zodResolver(manualForm),
    defaultValues: {
      meta: {
        sport: "running",
        protocol: "thresholds from an external lab report",
        date: today,
        endedBy: "plan",
        stopSign: null,
      },
      vt1: { hrBpm: null, powerW: null, speedKmh: null },
      vt2: { hrBpm: null, powerW: null, speedKmh: null },
      fiveZones: false,
    },
  });
  const submit = useSubmitter(athleteId, setError);
  const onSubmit = handleSubmit((v) =>
    submit({ kind: "manual", meta: v.meta, vt1: v.vt1, vt2: v.vt2, fiveZones: v.fiveZones }),
  );
  const box = (t: "vt1" | "vt2") => (
    <fieldset className="grid gap-3 sm:grid-cols-3">
      <legend className="mb-1 font-semibold">{t.toUpperCase()}</legend>
      {(
        [
          ["hrBpm", "Heart rate (bpm)"],
          ["powerW", "Power (W)"],
          ["speedKmh", "Speed (km/h)"],
        ] as const
      ).map(([k, label]) => (
        <div key={k}>
          <label htmlFor={`${t}-${k}`} className="field-label">
            {label}
          </label>
          <input
            id={`${t}-${k}`}
            type="number"
            step="0.1"
            className="field-input num"
            {...register(`${t}.${k}`, { setValueAs: num })}
          />
          <FieldError id={`${t}-${k}-e`} message={formState.errors[t]?.[k]?.message} />
        </div>
      ))}
    </fieldset>
  );
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <FormAlert>{formState.errors.root?.message}</FormAlert>
      <MetaFields
        register={register}
        errors={formState.errors}
        endedBy={useWatch({ control, name: "meta.endedBy" })}
        protocolHint="where the thresholds come from"
      />
      {box("vt1")}
      {box("vt2")}
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" {...register("fiveZones")} /> Also show five zones
      </label>
      <SubmitButton className="btn" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Save the thresholds"}
      </SubmitButton>
    </form>
  );
}
