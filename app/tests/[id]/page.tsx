import Link from "next/link";
import { notFound } from "next/navigation";
import { canCoachAthlete } from "@/features/access/lib/rules";
import { membershipsOfAthlete } from "@/features/access/server/permissions";
import { requirePageActor } from "@/features/access/server/current";
import { TestCautions } from "@/features/athlete-tests/components/Cautions";
import { TestBody, TestHeader } from "@/features/athlete-tests/components/TestSummary";
import { getTest } from "@/features/athlete-tests/server/tests";
import { HttpError } from "@/features/platform/server/http";
import { getAthleteProfile } from "@/features/athletes/server/profile";

export const metadata = { title: "Test" };

export default async function TestPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requirePageActor(`/tests/${id}`);
  const test = await getTest(actor, id).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  const maxHrBpm = (await getAthleteProfile(actor, test.athleteId)).profile.maxHrBpm;
  const canEdit = canCoachAthlete(actor, {
    userId: test.athleteId,
    memberships: await membershipsOfAthlete(test.athleteId),
  });
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <TestHeader test={test} />
        <div className="flex gap-2 text-sm">
          <Link href={`/tests/${id}/report`} className="btn-quiet">
            Printable report
          </Link>
          {test.file ? (
            <a href={`/api/tests/${id}/file`} className="btn-quiet">
              Original file
            </a>
          ) : null}
        </div>
      </div>
      <TestCautions />
      <TestBody test={test} canEdit={canEdit} units={actor.units} maxHrBpm={maxHrBpm} />
    </div>
  );
}
