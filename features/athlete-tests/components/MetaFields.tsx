"use client";
import type { FieldErrors, UseFormRegister } from "react-hook-form";
import { SPORT_LABELS, SPORTS } from "@/features/platform/lib/sports";
import { FieldError } from "@/features/platform/components/form-bits";
import { STOP_SIGNS } from "../schemas";

export interface MetaValues {
  meta: {
    sport: string;
    protocol: string;
    date: string;
    endedBy: "exhaustion" | "plan" | "stop_sign";
    stopSign?: string | null;
  };
}

/* eslint-disable @typescript-eslint/no-explicit-any -- shared by forms whose values extend MetaValues */
export function MetaFields({
  register,
  errors,
  endedBy,
  protocolHint,
}: {
  register: UseFormRegister<any>;
  errors: FieldErrors<any>;
  endedBy: string | undefined;
  protocolHint: string;
}) {
  const e = (errors.meta ?? {}) as Record<string, { message?: string } | undefined>;
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <div>
        <label htmlFor="meta-sport" className="field-label">
          Sport
        </label>
        <select id="meta-sport" className="field-input" {...register("meta.sport")}>
          {SPORTS.map((s) => (
            <option key={s} value={s}>
              {SPORT_LABELS[s]}
            </option>
          ))}
        </select>
        <FieldError id="meta-sport-error" message={e.sport?.message} />
      </div>
      <div>
        <label htmlFor="meta-date" className="field-label">
          Test date
        </label>
        <input
          id="meta-date"
          type="date"
          className="field-input num"
          aria-describedby="meta-date-error"
          {...register("meta.date")}
        />
        <FieldError id="meta-date-error" message={e.date?.message} />
      </div>
      <div className="sm:col-span-2">
        <label htmlFor="meta-protocol" className="field-label">
          Protocol <span className="font-normal text-ink-soft">({protocolHint})</span>
        </label>
        <input
          id="meta-protocol"
          className="field-input"
          aria-describedby="meta-protocol-error"
          {...register("meta.protocol")}
        />
        <FieldError id="meta-protocol-error" message={e.protocol?.message} />
      </div>
      <fieldset className="sm:col-span-2">
        <legend className="field-label">How did the test end?</legend>
        <div className="mt-1 flex flex-wrap gap-x-6 gap-y-1 text-sm">
          <label className="flex items-center gap-2">
            <input type="radio" value="exhaustion" {...register("meta.endedBy")} /> Exhaustion (the athlete could not go
            on)
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" value="plan" {...register("meta.endedBy")} /> As planned (submaximal end point)
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" value="stop_sign" {...register("meta.endedBy")} /> A stop sign
          </label>
        </div>
        <FieldError id="meta-endedBy-error" message={e.endedBy?.message} />
      </fieldset>
      {endedBy === "stop_sign" ? (
        <div className="sm:col-span-2">
          <label htmlFor="meta-stopSign" className="field-label">
            Which sign ended the test?
          </label>
          <select
            id="meta-stopSign"
            className="field-input"
            aria-describedby="meta-stopSign-error"
            {...register("meta.stopSign")}
          >
            <option value="">Choose…</option>
            {STOP_SIGNS.map((s) => (
              <option key={s.id} value={s.id}>
                {s.text}
              </option>
            ))}
          </select>
          <FieldError id="meta-stopSign-error" message={e.stopSign?.message} />
        </div>
      ) : null}
    </div>
  );
}
