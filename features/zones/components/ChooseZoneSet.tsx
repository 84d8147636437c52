"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useDates } from "@/features/platform/components/dates";
import { apiFetch, ApiError } from "@/features/platform/lib/api-client";

/** Puts one of several zone sets of the same sport and day in force (coaches). */
export function ChooseZoneSet({ id, date }: { id: string; date: string }) {
  const router = useRouter();
  const { day } = useDates();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <span>
      <button
        type="button"
        className="btn-quiet px-2 py-0.5 text-xs"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            await apiFetch(`/api/zone-sets/${id}/choose`, { method: "POST" });
            router.refresh();
          } catch (e) {
            setError(e instanceof ApiError ? e.message : "The choice was not saved.");
          } finally {
            setBusy(false);
          }
        }}
      >
        Use this one from {day(date)}
      </button>
      {error ? (
        <span role="alert" className="ml-2 text-xs text-alert">
          {error}
        </span>
      ) : null}
    </span>
  );
}
