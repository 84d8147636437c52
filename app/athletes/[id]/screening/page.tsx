import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/features/access/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { ScreeningForm } from "@/features/athlete-tests/components/ScreeningForm";
import { getScreening } from "@/features/athlete-tests/server/screening";
import { HttpError } from "@/features/platform/server/http";

export const metadata = { title: "Readiness screening" };

export default async function ScreeningPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requirePageActor(`/athletes/${id}/screening`);
  const data = await getAthleteProfile(actor, id).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  const screening = await getScreening(actor, id);
  return (
    <div className="mx-auto max-w-2xl space-y-4">
      <p className="text-sm font-semibold uppercase tracking-widest text-tide">
        <Link href={actor.userId === id ? "/zones" : `/athletes/${id}`} className="hover:underline">{data.athlete.name}</Link>
      </p>
      <h1 className="text-2xl font-bold">Readiness before testing</h1>
      <p className="text-sm text-ink-soft">
        Answer each question before a maximal test. A yes does not forbid training, but it means a physician or another
        licensed health professional should clear the athlete for a maximal test first. Tidemark is not a medical device.
      </p>
      <div className="card">
        <ScreeningForm athleteId={id} initial={screening.latest?.answers ?? null} advice={screening.advice} />
      </div>
      {screening.history.length ? (
        <p className="text-xs text-ink-soft">Earlier answers: {screening.history.map((h) => `${new Date(h.date).toISOString().slice(0, 10)} (${h.anyYes ? "a yes" : "all no"})`).join(", ")}</p>
      ) : null}
    </div>
  );
}
