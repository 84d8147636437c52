"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useHydrated } from "@/features/platform/components/use-hydrated";
import { FormAlert } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";

/** The one button of the unsubscribe page: turns that kind of message off, then shows the page's new state. */
export function TurnOffButton({ token, label }: { token: string; label: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const ready = useHydrated();
  const [error, setError] = useState<string>();
  const turnOff = async () => {
    setBusy(true);
    setError(undefined);
    try {
      await apiFetch(`/api/unsubscribe/${encodeURIComponent(token)}`, { method: "POST" });
      router.refresh();
    } catch (e) {
      setError(e instanceof Error ? e.message : "That did not work; please try again.");
      setBusy(false);
    }
  };
  return (
    <div className="space-y-2">
      <FormAlert>{error}</FormAlert>
      <button type="button" className="btn" onClick={turnOff} disabled={busy || !ready}>
        {busy ? "Turning off…" : `Turn off ${label}`}
      </button>
    </div>
  );
}
