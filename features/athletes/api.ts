"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/features/platform/lib/api-client";
import type { ProfileInput } from "./schemas";

export function useSaveProfile(athleteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (profile: ProfileInput & { version?: number }) =>
      apiFetch<{ profile: ProfileInput & { version: number } }>(`/api/athletes/${encodeURIComponent(athleteId)}/profile`, {
        method: "PATCH",
        body: JSON.stringify(profile),
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["athletes"] }),
  });
}
