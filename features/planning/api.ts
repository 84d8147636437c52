"use client";
import { queryOptions, useMutation, useQuery, useQueryClient, type QueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/features/platform/lib/api-client";
import type { Block } from "./lib/session";
import { planKeys } from "./query-keys";
import type { WeekSummary } from "./lib/weeks";

export interface SessionDto {
  id: string;
  date: string;
  title: string;
  kind: string;
  sport: string;
  minutesByZone: [number, number, number];
  totalS: number;
  seriesId: string | null;
  rrule: string | null;
  /** Edit counter: sent back with a change, so that a change on an older version answers 409. */
  version: number;
  structure: Block[];
  notes: string;
  log: {
    id: string;
    status: "done" | "partial" | "skipped";
    durationMin: number | null;
    rpe: number | null;
    measuredMinByZone: [number, number, number] | null;
    compliance: number;
  } | null;
}

/** The planner's queries: one factory per query, so keys are written once (TanStack Query's `queryOptions`). */
export const planQueries = {
  sessionsOf: planKeys.sessionsOf,
  weeksOf: planKeys.weeksOf,
  sessions: (athleteId: string, from: string, to: string) =>
    queryOptions({
      queryKey: planKeys.sessions(athleteId, from, to),
      queryFn: () => apiFetch<SessionDto[]>(`/api/athletes/${athleteId}/sessions?from=${from}&to=${to}`),
      enabled: !!from,
    }),
  weeks: (athleteId: string, from: string, to: string) =>
    queryOptions({
      queryKey: planKeys.weeks(athleteId, from, to),
      queryFn: () => apiFetch<WeekSummary[]>(`/api/athletes/${athleteId}/weeks?from=${from}&to=${to}`),
      enabled: !!from,
    }),
};

/** After any change to an athlete's plan: their sessions and weekly summaries are fetched again. */
export function invalidatePlan(qc: QueryClient, athleteId: string) {
  return Promise.all([
    qc.invalidateQueries({ queryKey: planQueries.sessionsOf(athleteId) }),
    qc.invalidateQueries({ queryKey: planQueries.weeksOf(athleteId) }),
  ]);
}

export function useSessions(athleteId: string, from: string, to: string) {
  return useQuery(planQueries.sessions(athleteId, from, to));
}

export function useWeeks(athleteId: string, from: string, to: string) {
  return useQuery(planQueries.weeks(athleteId, from, to));
}

/** Moves a session at once in the cache and rolls back with the server's reason when it refuses. */
export function useMoveSession(athleteId: string, from: string, to: string) {
  const qc = useQueryClient();
  const key = planQueries.sessions(athleteId, from, to).queryKey;
  return useMutation({
    mutationFn: (v: { id: string; date: string; scope?: "one" | "series"; version?: number }) =>
      apiFetch(`/api/sessions/${v.id}`, {
        method: "PATCH",
        body: JSON.stringify({
          date: v.date,
          scope: v.scope ?? "one",
          version: v.version ?? qc.getQueryData<SessionDto[]>(key)?.find((s) => s.id === v.id)?.version,
        }),
      }),
    onMutate: async (v) => {
      await qc.cancelQueries({ queryKey: key });
      const previous = qc.getQueryData<SessionDto[]>(key);
      qc.setQueryData<SessionDto[]>(key, (old) => old?.map((s) => (s.id === v.id ? { ...s, date: v.date } : s)));
      return { previous };
    },
    onError: (_e, _v, ctx) => {
      if (ctx?.previous) qc.setQueryData(key, ctx.previous);
    },
    onSettled: () => invalidatePlan(qc, athleteId),
  });
}

export function useCreateSession(athleteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: unknown) =>
      apiFetch<{ id: string }>(`/api/athletes/${athleteId}/sessions`, { method: "POST", body: JSON.stringify(body) }),
    onSettled: () => invalidatePlan(qc, athleteId),
  });
}

export function useDeleteSession(athleteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { id: string; scope: "one" | "series" }) =>
      apiFetch(`/api/sessions/${v.id}?scope=${v.scope}`, { method: "DELETE" }),
    onSettled: () => invalidatePlan(qc, athleteId),
  });
}
