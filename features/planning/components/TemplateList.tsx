"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { SPORT_LABELS } from "@/features/platform/lib/sports";
import { FormAlert } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";
import type { Block } from "../lib/session";
import { SessionProfile } from "./TemplateBuilder";

interface Row {
  id: string;
  name: string;
  sport: string;
  description: string;
  totalS: number;
  minutesByZone: [number, number, number];
  structure: unknown[];
  version: number;
}

export function TemplateList({ templates, onEdit }: { templates: Row[]; onEdit?: (t: Row) => void }) {
  const router = useRouter();
  const [q, setQ] = useState("");
  const [error, setError] = useState<string>();
  const shown = templates.filter((t) =>
    `${t.name} ${t.description} ${t.sport}`.toLowerCase().includes(q.trim().toLowerCase()),
  );
  const act = async (fn: () => Promise<unknown>) => {
    setError(undefined);
    try {
      await fn();
      router.refresh();
    } catch (e) {
      setError(e instanceof Error ? e.message : "That did not work.");
    }
  };
  return (
    <div className="space-y-3">
      <label className="block max-w-sm">
        <span className="field-label">Search templates</span>
        <input
          type="search"
          className="field-input"
          value={q}
          onChange={(e) => setQ(e.target.value)}
          placeholder="name, sport or description"
        />
      </label>
      <FormAlert>{error}</FormAlert>
      {shown.length === 0 ? (
        <p className="text-ink-soft">
          {templates.length ? "No template matches the search." : "No templates yet: build the first one above."}
        </p>
      ) : null}
      <ul className="grid gap-3 md:grid-cols-2">
        {shown.map((t) => (
          <li key={t.id} className="card space-y-1 p-4" data-testid="template-card">
            <p className="font-semibold">
              {t.name}{" "}
              <span className="text-sm font-normal text-ink-soft">
                · {(SPORT_LABELS as Record<string, string>)[t.sport] ?? t.sport}
              </span>
            </p>
            {t.description ? <p className="text-sm text-ink-soft">{t.description}</p> : null}
            <p className="num text-sm">
              {Math.round(t.totalS / 60)} min · zone 1 {Math.round(t.minutesByZone[0])} · zone 2{" "}
              {Math.round(t.minutesByZone[1])} · zone 3 {Math.round(t.minutesByZone[2])} min
            </p>
            <SessionProfile structure={t.structure as Block[]} />
            <div className="flex gap-3 text-sm">
              {onEdit ? (
                <button type="button" className="text-tide underline" onClick={() => onEdit(t)}>
                  Edit
                </button>
              ) : null}
              <button
                type="button"
                className="text-tide underline"
                onClick={() =>
                  act(() => apiFetch("/api/templates", { method: "POST", body: JSON.stringify({ copyOf: t.id }) }))
                }
              >
                Duplicate
              </button>
              <button
                type="button"
                className="text-alert underline"
                onClick={() => act(() => apiFetch(`/api/templates/${t.id}`, { method: "DELETE" }))}
              >
                Delete
              </button>
            </div>
          </li>
        ))}
      </ul>
    </div>
  );
}
