import { requirePageActor } from "@/features/access/server/current";
import { CreateSquadForm } from "@/features/squads/components/CreateSquadForm";

export const metadata = { title: "Start a squad" };

export default async function NewSquadPage() {
  await requirePageActor("/squads/new");
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-2xl font-bold">Start a squad</h1>
      <p className="mt-2 text-sm text-ink-soft">
        A squad is your group of athletes and coaches. You become its head coach; then invite athletes and coaches by
        e-mail. Joining someone else&apos;s squad? Open the invitation link from their e-mail instead.
      </p>
      <div className="card mt-6">
        <CreateSquadForm />
      </div>
    </div>
  );
}
