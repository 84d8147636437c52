import Link from "next/link";
import { Said } from "@/features/platform/components/dates";
import type { Readiness } from "../lib/readiness";

/**
 * What the screening answers mean for today, where tests and hard sessions are planned: a hold (symptom or illness), a
 * missing or expired screening, a maximal test waiting for clearance, and the caution on heart rate under medicine.
 */
export function ReadinessBanner({
  readiness,
  athleteId,
  context,
}: {
  readiness: Readiness;
  athleteId: string;
  context: "plan" | "today" | "test" | "athlete" | "screening";
}) {
  const r = readiness;
  const screening = `/athletes/${athleteId}/screening`;
  const hold = r.holdHardSessions;
  const showStatus =
    hold ||
    r.status === "maximal_needs_clearance" ||
    ((r.status === "missing" || r.status === "incomplete" || r.status === "expired") && context !== "plan");
  if (!showStatus && !r.hrMedication) return null;
  return (
    <div className="space-y-2" data-testid="readiness-banner">
      {showStatus ? (
        <section
          role={hold ? "alert" : "status"}
          className={`rounded-md border p-3 text-sm ${hold ? "border-alert bg-alert-wash text-alert" : "border-alert/40 bg-alert-wash text-alert"}`}
        >
          <p className="font-bold">{hold ? "Hold hard sessions and testing" : <Said>{r.label}</Said>}</p>
          {r.reasons.filter((x) => x.startsWith("Yes:")).length ? (
            <ul className="mt-1 list-disc pl-5">
              {r.reasons
                .filter((x) => x.startsWith("Yes:"))
                .map((x) => (
                  <li key={x}>
                    <Said>{x}</Said>
                  </li>
                ))}
            </ul>
          ) : (
            r.reasons.map((x) => (
              <p key={x} className="mt-1">
                <Said>{x}</Said>
              </p>
            ))
          )}
          {r.whatToDo ? (
            <p className="mt-1">
              <Said>{r.whatToDo}</Said>
            </p>
          ) : null}
          {hold && context === "today" ? (
            <p className="mt-1">
              Easy sessions in zone 1 are fine if you feel well; stop and seek help at once for chest pain, fainting or
              unusual breathlessness.
            </p>
          ) : null}
          {context === "screening" ? null : (
            <p className="mt-1">
              <Link href={screening} className="font-semibold underline">
                {r.status === "missing" || r.status === "incomplete" || r.status === "expired"
                  ? "Answer the readiness questions"
                  : "Readiness answers and clearance"}
              </Link>
            </p>
          )}
        </section>
      ) : null}
      {r.hrMedication ? (
        <p role="note" className="rounded-md border border-rule bg-paper p-3 text-sm">
          Heart-rate-lowering medicine was reported: heart rate does not track effort as usual, so heart-rate zones and
          TRIMP are unreliable. Use power, pace or RPE targets instead.
        </p>
      ) : null}
    </div>
  );
}
