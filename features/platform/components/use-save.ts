"use client";
import { useState } from "react";

/**
 * The state of a small settings form: busy while saving, then what to tell the person (saved, or the server's reason).
 * `save` runs the request and returns the text to show on success.
 */
export function useSave() {
  const [state, setState] = useState<{ kind: "ok" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  async function save(run: () => Promise<string>) {
    setBusy(true);
    setState(null);
    try {
      setState({ kind: "ok", text: await run() });
    } catch (err) {
      setState({ kind: "error", text: err instanceof Error ? err.message : "Saving failed." });
    } finally {
      setBusy(false);
    }
  }
  return { state, busy, save };
}
