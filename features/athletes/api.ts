"use client";
import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "@/features/platform/lib/api-client";
import type { ProfileInput } from "./schemas";

/** Saves an athlete's profile. No client query reads profiles (pages render them on the server), so the form refreshes
 * the page after a save instead of invalidating a query. */
export function useSaveProfile(athleteId: string) {
  return useMutation({
    mutationFn: (profile: ProfileInput & { version?: number }) =>
      apiFetch<{ profile: ProfileInput & { version: number } }>(
        `/api/athletes/${encodeURIComponent(athleteId)}/profile`,
        {
          method: "PATCH",
          body: JSON.stringify(profile),
        },
      ),
  });
}
