"use client";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { RosterRow } from "@/features/roster/lib/roster";
import type { InviteInput } from "./schemas";

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fieldErrors: Record<string, string[]> = {},
  ) {
    super(message);
  }
}

export async function apiFetch<T>(url: string, init?: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { ...init, headers: { "content-type": "application/json", ...init?.headers } });
  } catch {
    throw new ApiError(0, "Tidemark could not be reached. Check your connection and try again.");
  }
  if (res.status === 204) return undefined as T;
  const body = await res.json().catch(() => ({}));
  if (!res.ok) throw new ApiError(res.status, body.error ?? `The server answered ${res.status}.`, body.fieldErrors);
  return body as T;
}

export async function acceptInvitationRequest(token: string): Promise<{ ok: true } | { ok: false; error: string }> {
  try {
    await apiFetch(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: "POST" });
    return { ok: true };
  } catch (e) {
    return { ok: false, error: e instanceof Error ? e.message : "Joining failed." };
  }
}

export function useRoster(squadId: string) {
  return useQuery({
    queryKey: ["roster", squadId],
    queryFn: () => apiFetch<{ squadId: string | null; rows: RosterRow[] }>(`/api/roster?squad=${encodeURIComponent(squadId)}`),
  });
}

export interface OpenInvitation {
  id: string;
  email: string;
  role: "coach" | "athlete";
  expiresAt: string;
}

export function useInvitations(squadId: string, enabled: boolean) {
  return useQuery({
    queryKey: ["invitations", squadId],
    enabled,
    queryFn: () => apiFetch<OpenInvitation[]>(`/api/squads/${encodeURIComponent(squadId)}/invitations`),
  });
}

export function useWithdrawInvitation(squadId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) =>
      apiFetch<void>(`/api/squads/${encodeURIComponent(squadId)}/invitations/${encodeURIComponent(invitationId)}`, { method: "DELETE" }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["invitations", squadId] }),
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
    onSuccess: () => qc.invalidateQueries({ queryKey: ["invitations", squadId] }),
  });
}
