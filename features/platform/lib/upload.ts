"use client";
import { ApiError } from "@/features/platform/lib/api-client";

/** POSTs a multipart form and reports the upload's progress (0–1); resolves with the JSON body of a 201 answer. */
export function uploadWithProgress<T>(url: string, form: FormData, onProgress: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: { error?: string; fieldErrors?: Record<string, string[]> } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON */
      }
      if (xhr.status === 201) resolve(body as T);
      else reject(new ApiError(xhr.status, body.error ?? `The server answered ${xhr.status}.`, body.fieldErrors));
    };
    xhr.onerror = () => reject(new ApiError(0, "The upload failed: Tidemark could not be reached."));
    xhr.send(form);
  });
}
