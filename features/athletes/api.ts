"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/features/squads/api";
import type { ProfileInput } from "./schemas";

export function useSaveProfile(athleteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (profile: ProfileInput) =>
      apiFetch<{ profile: ProfileInput }>(`/api/athletes/${encodeURIComponent(athleteId)}/profile`, {
        method: "PATCH",
        body: JSON.stringify(profile),
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["athletes"] }),
  });
}
