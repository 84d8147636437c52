import { formatDay } from "@/features/platform/lib/date-format";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/features/access/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { ScreeningForm } from "@/features/athlete-tests/components/ScreeningForm";
import { getScreening } from "@/features/athlete-tests/server/screening";
import { HttpError } from "@/features/platform/server/http";
import { ClearanceForm } from "@/features/athlete-tests/components/ClearanceForm";
import { ReadinessBanner } from "@/features/athlete-tests/components/ReadinessBanner";
import { membershipsOfAthlete } from "@/features/access/server/permissions";
import { canCoachAthlete } from "@/features/access/lib/rules";

export const metadata = { title: "Readiness screening" };

export default async function ScreeningPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requirePageActor(`/athletes/${id}/screening`);
  const data = await getAthleteProfile(actor, id).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  const [screening, memberships] = await Promise.all([getScreening(actor, id), membershipsOfAthlete(id)]);
  const coaches = canCoachAthlete(actor, { userId: id, memberships });
  return (
    <div className="mx-auto max-w-2xl space-y-4">
      <p className="text-sm font-semibold uppercase tracking-widest text-tide">
        <Link href={actor.userId === id ? "/zones" : `/athletes/${id}`} className="hover:underline">
          {data.athlete.name}
        </Link>
      </p>
      <h1 className="text-2xl font-bold">Readiness before testing</h1>
      <p className="text-sm text-ink-soft">
        Answer each question before any test, again every 12 months and whenever something changes. A yes to a symptom
        or a recent illness holds testing and hard sessions until a physician or another licensed health professional
        has cleared the athlete; another yes means a maximal test waits for such a clearance. Tidemark is not a medical
        device: follow local clinical practice.
      </p>
      <ReadinessBanner readiness={screening.readiness} athleteId={id} context="screening" />
      <div className="card">
        <ScreeningForm
          athleteId={id}
          initial={screening.latest?.answers ?? null}
          advice={screening.latest ? screening.advice : null}
        />
      </div>
      {screening.clearances.length ? (
        <section className="card text-sm" aria-labelledby="clearances-h">
          <h2 id="clearances-h" className="font-bold">
            Clearances recorded
          </h2>
          <ul className="mt-1 space-y-1">
            {screening.clearances.map((c) => (
              <li key={c.recordedAt.toISOString()}>
                {formatDay(c.clearedOn, actor.dateStyle)}: {c.clearedBy} ({c.role}){c.note ? ` — ${c.note}` : ""}{" "}
                <span className="text-ink-soft">
                  (recorded {formatDay(c.recordedAt.toISOString().slice(0, 10), actor.dateStyle)})
                </span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {coaches &&
      screening.latest &&
      screening.readiness.status !== "ready" &&
      screening.readiness.status !== "expired" &&
      screening.readiness.status !== "incomplete" ? (
        <div className="card">
          <ClearanceForm athleteId={id} today={new Date().toISOString().slice(0, 10)} />
        </div>
      ) : null}
      {screening.history.length ? (
        <p className="text-xs text-ink-soft">
          Earlier answers:{" "}
          {screening.history
            .map(
              (h) =>
                `${formatDay(new Date(h.date).toISOString().slice(0, 10), actor.dateStyle)} (${h.anyYes ? "a yes" : "all no"})`,
            )
            .join(", ")}
        </p>
      ) : null}
    </div>
  );
}
