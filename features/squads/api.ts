"use client";
import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { RosterRow } from "@/features/roster/lib/roster";
import type { InviteInput } from "./schemas";
import { apiFetch } from "@/features/platform/lib/api-client";

export async function acceptInvitationRequest(token: string): Promise<{ ok: true } | { ok: false; error: string }> {
  try {
    await apiFetch(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: "POST" });
    return { ok: true };
  } catch (e) {
    return { ok: false, error: e instanceof Error ? e.message : "Joining failed." };
  }
}

/** The squad's queries, one factory each (TanStack Query's `queryOptions`). */
export const squadQueries = {
  roster: (squadId: string) =>
    queryOptions({
      queryKey: ["roster", squadId] as const,
      queryFn: () =>
        apiFetch<{ squadId: string | null; rows: RosterRow[] }>(`/api/roster?squad=${encodeURIComponent(squadId)}`),
    }),
  invitations: (squadId: string) =>
    queryOptions({
      queryKey: ["invitations", squadId] as const,
      queryFn: () => apiFetch<OpenInvitation[]>(`/api/squads/${encodeURIComponent(squadId)}/invitations`),
    }),
};

export function useRoster(squadId: string) {
  return useQuery(squadQueries.roster(squadId));
}

export interface OpenInvitation {
  id: string;
  email: string;
  role: "coach" | "athlete";
  expiresAt: string;
}

export function useInvitations(squadId: string, enabled: boolean) {
  return useQuery({ ...squadQueries.invitations(squadId), enabled });
}

export function useWithdrawInvitation(squadId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      apiFetch<void>(`/api/squads/${encodeURIComponent(squadId)}/invitations/${encodeURIComponent(invitationId)}`, {
        method: "DELETE",
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: squadQueries.invitations(squadId).queryKey }),
  });
}

export function useInvite(squadId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteInput) =>
      apiFetch<OpenInvitation>(`/api/squads/${encodeURIComponent(squadId)}/invitations`, {
        method: "POST",
        body: JSON.stringify(input),
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: squadQueries.invitations(squadId).queryKey }),
  });
}
