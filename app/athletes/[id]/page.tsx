import { notFound } from "next/navigation";
import { requirePageActor } from "@/features/auth/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { ProfileForm } from "@/features/athletes/components/ProfileForm";
import { HttpError } from "@/features/platform/server/http";

export const metadata = { title: "Athlete" };

export default async function AthletePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requirePageActor(`/athletes/${id}`);
  const data = await getAthleteProfile(actor, id).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  return (
    <div className="mx-auto max-w-2xl space-y-4">
      <div>
        <p className="text-sm font-semibold uppercase tracking-widest text-tide">Athlete</p>
        <h1 className="text-2xl font-bold">{data.athlete.name}</h1>
        <p className="text-sm text-ink-soft">{data.athlete.email}</p>
      </div>
      <div className="card">
        <ProfileForm athleteId={data.athlete.id} initial={data.profile} isSelf={actor.userId === id} />
      </div>
    </div>
  );
}
