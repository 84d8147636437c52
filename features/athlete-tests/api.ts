"use client";
import { ApiError, apiFetch } from "@/features/squads/api";

export function createJsonTest(athleteId: string, body: unknown) {
  return apiFetch<{ id: string }>(`/api/athletes/${encodeURIComponent(athleteId)}/tests`, { method: "POST", body: JSON.stringify(body) });
}

/** Uploads a gas-exchange file with progress (XMLHttpRequest reports upload progress; fetch does not). */
export function uploadGasExchange(athleteId: string, form: FormData, onProgress: (fraction: number) => void): Promise<{ id: string }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/athletes/${encodeURIComponent(athleteId)}/tests`);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: { error?: string; fieldErrors?: Record<string, string[]>; id?: string } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON */
      }
      if (xhr.status === 201 && body.id) resolve({ id: body.id });
      else reject(new ApiError(xhr.status, body.error ?? `The server answered ${xhr.status}.`, body.fieldErrors));
    };
    xhr.onerror = () => reject(new ApiError(0, "The upload failed: Tidemark could not be reached."));
    xhr.send(form);
  });
}

export function patchThresholds(testId: string, body: unknown) {
  return apiFetch(`/api/tests/${encodeURIComponent(testId)}/thresholds`, { method: "PATCH", body: JSON.stringify(body) });
}

export function saveScreening(athleteId: string, body: unknown) {
  return apiFetch<{ advice: string | null }>(`/api/athletes/${encodeURIComponent(athleteId)}/screening`, { method: "PUT", body: JSON.stringify(body) });
}
