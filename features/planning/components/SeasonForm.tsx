"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
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
  eventName: z.string().trim().min(1, "Name the event."),
  eventDate: isoDate,
  weeklyHours: z.number({ error: "Give weekly hours." }).positive("Above 0.").max(40, "At most 40 hours."),
  level: z.enum(["trained", "beginner"]),
  retestEveryWeeks: z.number().int().min(12, "12 to 16 weeks.").max(16, "12 to 16 weeks."),
});
type Values = z.infer<typeof form>;

export function SeasonForm({ athleteId, today, sport }: { athleteId: string; today: string; sport: string }) {
  const router = useRouter();
  const { register, handleSubmit, formState, setError } = useForm<Values>({
    resolver: zodResolver(form),
    defaultValues: {
      name: "",
      sport: (SPORTS as readonly string[]).includes(sport) ? (sport as Values["sport"]) : "running",
      startDate: today,
      eventName: "",
      eventDate: "",
      weeklyHours: 6,
      level: "trained",
      retestEveryWeeks: 12,
    },
  });
  const e = formState.errors;
  const onSubmit = handleSubmit(async (v) => {
    try {
      await apiFetch(`/api/athletes/${athleteId}/seasons`, {
        method: "POST",
        body: JSON.stringify({
          name: v.name,
          sport: v.sport,
          startDate: v.startDate,
          events: [{ date: v.eventDate, name: v.eventName }],
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
  const field = (name: keyof Values, label: string, type = "text", extra: object = {}) => (
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
      {field("eventName", "Target event")}
      {field("eventDate", "Event date", "date")}
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
        loading weeks then 1 unloading week, a taper before the event and retests in unloading weeks.
      </p>
    </form>
  );
}
