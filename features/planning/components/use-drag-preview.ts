"use client";
import { useEffect, useMemo, useState } from "react";
import { localDate } from "@/features/platform/lib/dates";
import { mondayOf } from "@/features/platform/lib/days";
import type { SessionDto } from "../api";
import { summariseWeeks, type SeasonWeekInfo, type WeekSession, type WeekSummary } from "../lib/weeks";
import type { TrayTemplate } from "./PlanCalendar";

/**
 * The budget band's preview while a session or a template is dragged: the week as it would be after the drop, judged by
 * the same engine as the server's band, with each week's budget, role and volume target and the athlete's planning rules
 * as the server gave them. The
 * preview ends whenever a drag ends, wherever that is.
 */
export function useDragPreview(
  sessions: SessionDto[] | undefined,
  weeks: WeekSummary[] | undefined,
  templates: TrayTemplate[],
) {
  const [preview, setPreview] = useState<WeekSummary | null>(null);

  useEffect(() => {
    const clear = () => setTimeout(() => setPreview(null), 0);
    document.addEventListener("pointerup", clear);
    document.addEventListener("mouseup", clear);
    return () => {
      document.removeEventListener("pointerup", clear);
      document.removeEventListener("mouseup", clear);
    };
  }, []);

  const seasonWeeks: SeasonWeekInfo[] = useMemo(
    () =>
      (weeks ?? []).map((w) => ({
        weekStart: w.weekStart,
        budget: w.budget.key,
        block: w.block ?? "",
        retest: false,
        role: w.role ?? undefined,
        volumeHours: w.targetMin !== null ? w.targetMin / 60 : undefined,
      })),
    [weeks],
  );

  function previewFor(date: string, moving: { id?: string; templateId?: string }) {
    const base: WeekSession[] = (sessions ?? []).map((s) => ({
      id: s.id,
      date: s.date,
      title: s.title,
      kind: s.kind,
      minutesByZone: s.minutesByZone,
    }));
    let next = base;
    if (moving.id) next = base.map((s) => (s.id === moving.id ? { ...s, date } : s));
    else if (moving.templateId) {
      const t = templates.find((x) => x.id === moving.templateId);
      if (t) next = [...base, { id: "__new", date, title: t.name, kind: "training", minutesByZone: t.minutesByZone }];
    }
    const week = mondayOf(date);
    // The coach's own day stands in for the athlete's (at most a day apart): it decides only whether the week has begun.
    const today = localDate(new Date(), Intl.DateTimeFormat().resolvedOptions().timeZone);
    const [summary] = summariseWeeks({
      from: week,
      to: week,
      sessions: next,
      seasonWeeks,
      today,
      withFix: false,
      rules: weeks?.[0]?.rules,
    });
    setPreview(summary ?? null);
  }

  return { preview, previewFor, clearPreview: () => setPreview(null) };
}
