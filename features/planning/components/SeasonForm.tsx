"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useFieldArray, useForm } from "react-hook-form";
import { z } from "zod";
import { SPORT_LABELS, SPORTS } from "@/features/platform/lib/sports";
import { FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";
import { isoDate } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

const form = z.object({
  name: z.string().trim().min(2, "Name the season."),
  sport: z.enum(SPORTS),
  startDate: isoDate,
  events: z
    .array(
      z.object({
        name: z.string().trim().min(1, "Name the event."),
        date: isoDate,
        priority: z.enum(["A", "B", "C"]),
        length: z
          .string()
          .trim()
          .regex(/^(\d{1,2}:[0-5]\d)?$/, "Give the length as h:mm, e.g. 3:30, or leave it empty."),
      }),
    )
    .min(1, "Give at least one event.")
    .max(8, "At most eight events."),
  weeklyHours: z.number({ error: "Give weekly hours." }).positive("Above 0.").max(40, "At most 40 hours."),
  level: z.enum(["trained", "beginner"]),
  retestEveryWeeks: z.number().int().min(12, "12 to 16 weeks.").max(16, "12 to 16 weeks."),
});
type Values = z.infer<typeof form>;

export function SeasonForm({ athleteId, today, sport }: { athleteId: string; today: string; sport: string }) {
  const router = useRouter();
  const { register, handleSubmit, formState, setError, control } = useForm<Values>({
    resolver: zodResolver(form),
    defaultValues: {
      name: "",
      sport: (SPORTS as readonly string[]).includes(sport) ? (sport as Values["sport"]) : "running",
      startDate: today,
      events: [{ name: "", date: "", priority: "A", length: "" }],
      weeklyHours: 6,
      level: "trained",
      retestEveryWeeks: 12,
    },
  });
  const e = formState.errors;
  const events = useFieldArray({ control, name: "events" });
  const onSubmit = handleSubmit(async (v) => {
    try {
      await apiFetch(`/api/athletes/${athleteId}/seasons`, {
        method: "POST",
        body: JSON.stringify({
          name: v.name,
          sport: v.sport,
          startDate: v.startDate,
          events: v.events.map(({ length, ...ev }) => {
            const [h, m] = length ? length.split(":").map(Number) : [];
            return length ? { ...ev, durationMin: h! * 60 + m! } : ev;
          }),
          weeklyHours: v.weeklyHours,
          level: v.level,
          retestEveryWeeks: v.retestEveryWeeks,
        }),
      });
      router.refresh();
    } catch (err) {
      setError("root", { message: err instanceof Error ? err.message : "The season could not be created." });
    }
  });
  const field = (name: Exclude<keyof Values, "events">, label: string, type = "text", extra: object = {}) => (
    <div>
      <label htmlFor={`season-${name}`} className="field-label">
        {label}
      </label>
      <input
        id={`season-${name}`}
        type={type}
        className="field-input num"
        {...register(name, type === "number" ? { valueAsNumber: true } : {})}
        {...extra}
      />
      <FieldError id={`season-${name}-e`} message={e[name]?.message} />
    </div>
  );
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-3">
      <div className="sm:col-span-3">
        <FormAlert>{e.root?.message}</FormAlert>
      </div>
      {field("name", "Season name")}
      <div>
        <label htmlFor="season-sport" className="field-label">
          Sport
        </label>
        <select id="season-sport" className="field-input" {...register("sport")}>
          {SPORTS.map((s) => (
            <option key={s} value={s}>
              {SPORT_LABELS[s]}
            </option>
          ))}
        </select>
      </div>
      {field("startDate", "Start", "date")}
      <fieldset className="space-y-2 sm:col-span-3">
        <legend className="field-label">
          Events (A: the goal, full taper and recovery; B: short taper; C: trained through). A race length scales the
          recovery after it (about three days per hour raced after an A race, two after a B race).
        </legend>
        {events.fields.map((f, i) => {
          const label =
            i === 0
              ? { name: "Target event", date: "Event date", priority: "Priority", length: "Race length" }
              : {
                  name: `Event ${i + 1}`,
                  date: `Event ${i + 1} date`,
                  priority: `Event ${i + 1} priority`,
                  length: `Event ${i + 1} length`,
                };
          const err = e.events?.[i];
          return (
            <div key={f.id} className="grid gap-2 sm:grid-cols-[2fr_1fr_1fr_1fr_auto]">
              <div>
                <label htmlFor={`season-event-${i}-name`} className="field-label">
                  {label.name}
                </label>
                <input id={`season-event-${i}-name`} className="field-input" {...register(`events.${i}.name`)} />
                <FieldError id={`season-event-${i}-name-e`} message={err?.name?.message} />
              </div>
              <div>
                <label htmlFor={`season-event-${i}-date`} className="field-label">
                  {label.date}
                </label>
                <input
                  id={`season-event-${i}-date`}
                  type="date"
                  className="field-input num"
                  {...register(`events.${i}.date`)}
                />
                <FieldError id={`season-event-${i}-date-e`} message={err?.date?.message} />
              </div>
              <div>
                <label htmlFor={`season-event-${i}-priority`} className="field-label">
                  {label.priority}
                </label>
                <select id={`season-event-${i}-priority`} className="field-input" {...register(`events.${i}.priority`)}>
                  <option value="A">A: the goal</option>
                  <option value="B">B: important</option>
                  <option value="C">C: trained through</option>
                </select>
              </div>
              <div>
                <label htmlFor={`season-event-${i}-length`} className="field-label">
                  {label.length} <span className="font-normal text-ink-soft">(h:mm, optional)</span>
                </label>
                <input
                  id={`season-event-${i}-length`}
                  className="field-input num"
                  inputMode="numeric"
                  placeholder="3:30"
                  aria-describedby={`season-event-${i}-length-e`}
                  {...register(`events.${i}.length`)}
                />
                <FieldError id={`season-event-${i}-length-e`} message={err?.length?.message} />
              </div>
              <div className="flex items-end">
                {events.fields.length > 1 ? (
                  <button type="button" className="btn-quiet py-1 text-sm" onClick={() => events.remove(i)}>
                    Remove
                  </button>
                ) : null}
              </div>
            </div>
          );
        })}
        {events.fields.length < 8 ? (
          <button
            type="button"
            className="btn-quiet py-1 text-sm"
            onClick={() => events.append({ name: "", date: "", priority: "B", length: "" })}
          >
            Add an event
          </button>
        ) : null}
        <FieldError id="season-events-e" message={e.events?.message ?? e.events?.root?.message} />
      </fieldset>
      {field("weeklyHours", "Weekly hours now (h)", "number", { step: "0.5" })}
      <div>
        <label htmlFor="season-level" className="field-label">
          Athlete
        </label>
        <select id="season-level" className="field-input" {...register("level")}>
          <option value="trained">Trained (polarised budget)</option>
          <option value="beginner">Beginner (pyramidal budget)</option>
        </select>
      </div>
      {field("retestEveryWeeks", "Retest every (weeks, 12–16)", "number")}
      <div className="flex items-end">
        <SubmitButton className="btn w-full" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? "Planning…" : "Generate the season"}
        </SubmitButton>
      </div>
      <p className="text-xs text-ink-soft sm:col-span-3">
        Weekly volume rises at most 10 % over recent weeks (a common caution with weak evidence, not a law), with 3
        loading weeks then 1 unloading week, a taper before each A event and a recovery week after it, a shorter taper
        for B events, none for C events, and retests in unloading weeks.
      </p>
    </form>
  );
}
