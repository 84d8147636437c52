import { STOP_SIGNS } from "../schemas";

export function TestCautions() {
  return (
    <aside className="rounded-lg border border-alert/30 bg-alert-wash/60 p-4 text-sm" aria-label="Safety">
      <p className="font-semibold">Safety first</p>
      <p className="mt-1">
        Tidemark is not a medical device. Maximal exercise testing carries risk: screen the athlete before the test,
        have someone trained in first aid present, and follow local clinical practice and the advice of licensed health
        professionals. Thresholds and zones are aids to judgement, not diagnoses.
      </p>
    </aside>
  );
}

/** The usual signs for stopping a test, shown as a checklist while the test runs. */
export function StopSignChecklist() {
  return (
    <fieldset className="rounded-lg border border-rule p-4">
      <legend className="px-1 text-sm font-semibold">Stop the test at once if you see any of these</legend>
      <ul className="mt-1 space-y-1 text-sm">
        {STOP_SIGNS.map((s) => (
          <li key={s.id}>
            <label className="flex items-start gap-2">
              <input type="checkbox" className="mt-1" aria-describedby="stop-sign-help" />
              <span>{s.text}</span>
            </label>
          </li>
        ))}
      </ul>
      <p id="stop-sign-help" className="mt-2 text-xs text-ink-soft">
        Tick a sign when you check for it during the test. If one ended the test, record it below.
      </p>
    </fieldset>
  );
}
