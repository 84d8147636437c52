"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { saveScreening } from "../api";
import { SCREENING_QUESTIONS } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

type Answers = Partial<Record<string, boolean>>;

export function ScreeningForm({
  athleteId,
  initial,
  advice,
}: {
  athleteId: string;
  initial: Answers | null;
  advice: string | null;
}) {
  const router = useRouter();
  const [answers, setAnswers] = useState<Answers>(initial ?? {});
  const [error, setError] = useState<string>();
  const [result, setResult] = useState<string | null>(advice);
  const [saved, setSaved] = useState(false);
  const [busy, setBusy] = useState(false);
  const missing = SCREENING_QUESTIONS.filter((q) => answers[q.id] === undefined).length;
  return (
    <form
      noValidate
      className="space-y-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setSaved(false);
        if (missing) return setError(`Answer every question: ${missing} still open.`);
        setBusy(true);
        setError(undefined);
        try {
          const r = await saveScreening(athleteId, { answers });
          setResult(r.advice);
          setSaved(true);
          router.refresh();
        } catch (err) {
          setError(err instanceof Error ? err.message : "Saving failed.");
        } finally {
          setBusy(false);
        }
      }}
    >
      <FormAlert>{error}</FormAlert>
      {result ? (
        <FormAlert>{result}</FormAlert>
      ) : saved ? (
        <FormNotice>Saved. No answer needs medical clearance.</FormNotice>
      ) : null}
      <ol className="space-y-3">
        {SCREENING_QUESTIONS.map((q, i) => (
          <li key={q.id}>
            <fieldset>
              <legend className="text-sm">
                {i + 1}. {q.text}
              </legend>
              <div className="mt-1 flex gap-6 text-sm">
                {[true, false].map((v) => (
                  <label key={String(v)} className="flex items-center gap-2">
                    <input
                      type="radio"
                      name={`screen-${q.id}`}
                      checked={answers[q.id] === v}
                      onChange={() => setAnswers((prev) => ({ ...prev, [q.id]: v }))}
                    />
                    {v ? "Yes" : "No"}
                  </label>
                ))}
              </div>
            </fieldset>
          </li>
        ))}
      </ol>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Saving…" : "Save the answers"}
      </SubmitButton>
    </form>
  );
}
