"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { FieldError, FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { ApiError } from "@/features/platform/lib/api-client";
import { useSaveProfile } from "../api";
import { profileSchema, type ProfileInput } from "../schemas";
import { SPORT_LABELS, SPORTS } from "@/features/platform/lib/sports";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

const toNumberOrNull = (v: unknown) => (v === "" || v == null ? null : Number(v));

export function ProfileForm({
  athleteId,
  initial,
  isSelf,
}: {
  athleteId: string;
  initial: ProfileInput & { version?: number };
  isSelf: boolean;
}) {
  const router = useRouter();
  const save = useSaveProfile(athleteId);
  const [saved, setSaved] = useState(false);
  // The version this form started from; each save answers the next one.
  const [version, setVersion] = useState(initial.version);
  const timeZones = useMemo(() => Intl.supportedValuesOf("timeZone"), []);
  const { register, handleSubmit, formState, setError } = useForm<ProfileInput>({
    resolver: zodResolver(profileSchema),
    defaultValues: initial,
  });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setSaved(false);
    try {
      const result = await save.mutateAsync({ ...values, version });
      setVersion(result.profile.version);
      setSaved(true);
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.status === 409) {
        router.refresh();
        return setError("root", {
          message: `${e.message} Reload the page to see it; your entries here are kept until then.`,
        });
      }
      if (e instanceof ApiError && Object.keys(e.fieldErrors).length) {
        for (const [field, messages] of Object.entries(e.fieldErrors)) {
          setError(field as keyof ProfileInput, { message: messages[0] });
        }
      } else setError("root", { message: e instanceof Error ? e.message : "Saving failed." });
    }
  });

  const num = (
    name: "birthYear" | "bodyMassKg" | "restingHrBpm" | "maxHrBpm",
    label: string,
    unit: string,
    step = "1",
  ) => (
    <div>
      <label htmlFor={name} className="field-label">
        {label} <span className="font-normal text-ink-soft">({unit})</span>
      </label>
      <input
        id={name}
        inputMode="decimal"
        type="number"
        step={step}
        className="field-input num"
        aria-invalid={!!errors[name]}
        aria-describedby={`${name}-error`}
        {...register(name, { setValueAs: toNumberOrNull })}
      />
      <FieldError id={`${name}-error`} message={errors[name]?.message} />
    </div>
  );

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <FormAlert>{errors.root?.message}</FormAlert>
      {saved ? <FormNotice>Saved.</FormNotice> : null}
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Body and heart</legend>
        {num("birthYear", "Year of birth", "year")}
        <div>
          <label htmlFor="sex" className="field-label">
            Sex <span className="font-normal text-ink-soft">(for sex-specific formulas)</span>
          </label>
          <select id="sex" className="field-input" {...register("sex", { setValueAs: (v) => (v === "" ? null : v) })}>
            <option value="">Not given</option>
            <option value="female">Female</option>
            <option value="male">Male</option>
          </select>
          <FieldError id="sex-error" message={errors.sex?.message} />
        </div>
        {num("bodyMassKg", "Body mass", "kg", "0.1")}
        {num("restingHrBpm", "Resting heart rate", "bpm")}
        {num("maxHrBpm", "Maximal heart rate", "bpm, measured")}
      </fieldset>
      <fieldset>
        <legend className="mb-2 text-lg font-bold">Sports</legend>
        <div className="flex flex-wrap gap-x-6 gap-y-2">
          {SPORTS.map((s) => (
            <label key={s} className="flex items-center gap-2 text-sm">
              <input type="checkbox" value={s} {...register("sports")} />
              {SPORT_LABELS[s]}
            </label>
          ))}
        </div>
        <FieldError id="sports-error" message={errors.sports?.message} />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-lg font-bold">Time zone and reminders</legend>
        <div className="sm:col-span-2">
          <label htmlFor="timeZone" className="field-label">
            Time zone
          </label>
          <select id="timeZone" className="field-input" aria-describedby="timeZone-error" {...register("timeZone")}>
            {timeZones.includes(initial.timeZone) ? null : <option value={initial.timeZone}>{initial.timeZone}</option>}
            {timeZones.map((tz) => (
              <option key={tz} value={tz}>
                {tz.replaceAll("_", " ")}
              </option>
            ))}
          </select>
          <FieldError id="timeZone-error" message={errors.timeZone?.message} />
        </div>
        <div>
          <label htmlFor="reminderTiming" className="field-label">
            Session reminders
          </label>
          <select id="reminderTiming" className="field-input" {...register("reminderTiming")}>
            <option value="evening_before">The evening before</option>
            <option value="morning_of">The morning of the session</option>
            <option value="off">No session reminders</option>
          </select>
        </div>
        <div>
          <label htmlFor="reminderTime" className="field-label">
            At <span className="font-normal text-ink-soft">(local time, HH:MM)</span>
          </label>
          <input
            id="reminderTime"
            type="time"
            className="field-input num"
            aria-describedby="reminderTime-error"
            {...register("reminderTime")}
          />
          <FieldError id="reminderTime-error" message={errors.reminderTime?.message} />
        </div>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("remindSessions")} /> E-mail me the day&apos;s sessions
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("remindRetests")} /> E-mail me before a retest
        </label>
      </fieldset>
      {isSelf ? (
        <p className="text-sm text-ink-soft">
          Your coach&apos;s planning rules: at most {initial.maxHardDays} hard{" "}
          {initial.maxHardDays === 1 ? "day" : "days"} a week,{" "}
          {initial.hardDaysBackToBack ? "hard days may follow each other" : "never two in a row"}; a week may stray{" "}
          {initial.volumeTolerancePct} % from its planned volume.
        </p>
      ) : (
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-lg font-bold">Planning rules</legend>
          <p className="text-sm text-ink-soft sm:col-span-2">
            The week checks use these for this athlete. A hard day holds 10 min or more of zone 3, or 30 min or more of
            zone 2; two or three a week, never two in a row, is common practice.
          </p>
          <div>
            <label htmlFor="maxHardDays" className="field-label">
              Hard days a week, at most
            </label>
            <input
              id="maxHardDays"
              type="number"
              min={1}
              max={7}
              step={1}
              inputMode="numeric"
              className="field-input num"
              aria-invalid={!!errors.maxHardDays}
              aria-describedby="maxHardDays-error"
              {...register("maxHardDays", { valueAsNumber: true })}
            />
            <FieldError id="maxHardDays-error" message={errors.maxHardDays?.message} />
          </div>
          <div>
            <label htmlFor="volumeTolerancePct" className="field-label">
              Flag a week this far off its volume target{" "}
              <span className="font-normal text-ink-soft">(%, either way)</span>
            </label>
            <input
              id="volumeTolerancePct"
              type="number"
              min={5}
              max={50}
              step={1}
              inputMode="numeric"
              className="field-input num"
              aria-invalid={!!errors.volumeTolerancePct}
              aria-describedby="volumeTolerancePct-error"
              {...register("volumeTolerancePct", { valueAsNumber: true })}
            />
            <FieldError id="volumeTolerancePct-error" message={errors.volumeTolerancePct?.message} />
          </div>
          <label className="flex items-center gap-2 text-sm sm:col-span-2">
            <input type="checkbox" {...register("hardDaysBackToBack")} /> Hard days may follow each other
          </label>
        </fieldset>
      )}
      <SubmitButton className="btn" disabled={isSubmitting}>
        {isSubmitting ? "Saving…" : isSelf ? "Save my profile" : "Save the athlete's profile"}
      </SubmitButton>
    </form>
  );
}
