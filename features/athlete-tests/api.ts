"use client";
import { uploadWithProgress } from "@/features/platform/lib/upload";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";

export function createJsonTest(athleteId: string, body: unknown) {
  return apiFetch<{ id: string }>(`/api/athletes/${encodeURIComponent(athleteId)}/tests`, {
    method: "POST",
    body: JSON.stringify(body),
  });
}

/** Uploads a gas-exchange file with progress (XMLHttpRequest reports upload progress; fetch does not). */
export async function uploadGasExchange(
  athleteId: string,
  form: FormData,
  onProgress: (fraction: number) => void,
): Promise<{ id: string }> {
  const body = await uploadWithProgress<{ id?: string }>(
    `/api/athletes/${encodeURIComponent(athleteId)}/tests`,
    form,
    onProgress,
  );
  if (!body.id) throw new ApiError(500, "The server did not say which test it saved.");
  return { id: body.id };
}

export function patchThresholds(testId: string, body: unknown) {
  return apiFetch(`/api/tests/${encodeURIComponent(testId)}/thresholds`, {
    method: "PATCH",
    body: JSON.stringify(body),
  });
}

export function saveScreening(athleteId: string, body: unknown) {
  return apiFetch<{ advice: string | null }>(`/api/athletes/${encodeURIComponent(athleteId)}/screening`, {
    method: "PUT",
    body: JSON.stringify(body),
  });
}

export function saveClearance(athleteId: string, body: unknown) {
  return apiFetch<{ advice: string | null }>(`/api/athletes/${encodeURIComponent(athleteId)}/screening/clearance`, {
    method: "POST",
    body: JSON.stringify(body),
  });
}

/** Sets the test segment by hand (nulls give it back to the finder); the server analyses the file again. */
export function putSegment(testId: string, body: { fromS: number | null; toS: number | null }) {
  return apiFetch(`/api/tests/${encodeURIComponent(testId)}/segment`, { method: "PUT", body: JSON.stringify(body) });
}
