import { notFound } from "next/navigation";
import { requirePageActor } from "@/features/access/server/current";
import { TestCautions } from "@/features/athlete-tests/components/Cautions";
import { PrintButton } from "@/features/athlete-tests/components/PrintButton";
import { TestBody, TestHeader } from "@/features/athlete-tests/components/TestSummary";
import { getTest } from "@/features/athlete-tests/server/tests";
import { HttpError } from "@/features/platform/server/http";
import { getAthleteProfile } from "@/features/athletes/server/profile";

export const metadata = { title: "Test report" };

export default async function TestReportPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requirePageActor(`/tests/${id}/report`);
  const test = await getTest(actor, id).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  const maxHrBpm = (await getAthleteProfile(actor, test.athleteId)).profile.maxHrBpm;
  return (
    <article className="report space-y-6">
      <div className="flex items-start justify-between gap-4">
        <TestHeader test={test} />
        <PrintButton />
      </div>
      <TestBody test={test} canEdit={false} interactive={false} units={actor.units} maxHrBpm={maxHrBpm} />
      <TestCautions />
      <p className="text-xs text-ink-soft">
        Report printed from Tidemark. Thresholds: V-slope (Beaver, Wasserman &amp; Whipp 1986) and ventilatory
        equivalents; talk test after Persinger, Foster et al. 2004; zones bounded by VT1 and VT2.
      </p>
    </article>
  );
}
