import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageActor } from "@/features/access/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { requireAthleteAccess } from "@/features/access/server/permissions";
import { StopSignChecklist, TestCautions } from "@/features/athlete-tests/components/Cautions";
import { ManualThresholdsForm, SubmaxForm, TalkTestForm } from "@/features/athlete-tests/components/FieldTestForms";
import { GasExchangeUpload } from "@/features/athlete-tests/components/GasExchangeUpload";
import { getScreening } from "@/features/athlete-tests/server/screening";
import { HttpError } from "@/features/platform/server/http";
import { ReadinessBanner } from "@/features/athlete-tests/components/ReadinessBanner";
import { testAllowed } from "@/features/athlete-tests/lib/readiness";

export const metadata = { title: "Record a test" };

const TITLES = {
  gas: "Upload a gas-exchange test",
  talk: "Record a talk test",
  submax: "Submaximal VO2max estimate",
  manual: "Enter thresholds by hand",
} as const;

export default async function NewTestPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ kind?: string }>;
}) {
  const { id } = await params;
  const { kind: rawKind } = await searchParams;
  const kind = (rawKind && rawKind in TITLES ? rawKind : "gas") as keyof typeof TITLES;
  const actor = await requirePageActor(`/athletes/${id}/tests/new?kind=${kind}`);
  try {
    await requireAthleteAccess(actor, id, "coach");
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) notFound();
    return (
      <div className="mx-auto max-w-lg card" role="alert">
        <h1 className="text-xl font-bold">Only coaches record tests</h1>
        <p className="mt-2">Your coach records your tests; you can read them and your zones on your zones page.</p>
      </div>
    );
  }
  const [{ athlete, profile }, screening] = await Promise.all([getAthleteProfile(actor, id), getScreening(actor, id)]);
  const today = new Date().toISOString().slice(0, 10);
  const age = profile.birthYear ? new Date().getUTCFullYear() - profile.birthYear : null;
  return (
    <div className="space-y-6">
      <div>
        <p className="text-sm font-semibold uppercase tracking-widest text-tide">
          <Link href={`/athletes/${id}`} className="hover:underline">
            {athlete.name}
          </Link>
        </p>
        <h1 className="text-2xl font-bold">{TITLES[kind]}</h1>
      </div>
      <nav aria-label="Kind of test" className="flex flex-wrap gap-2 text-sm">
        {(Object.keys(TITLES) as (keyof typeof TITLES)[]).map((k) => (
          <Link
            key={k}
            href={`/athletes/${id}/tests/new?kind=${k}`}
            aria-current={k === kind ? "page" : undefined}
            className={k === kind ? "btn" : "btn-quiet"}
          >
            {TITLES[k]}
          </Link>
        ))}
      </nav>
      <TestCautions />
      <ReadinessBanner readiness={screening.readiness} athleteId={id} context="test" />
      {!testAllowed(screening.readiness, kind === "gas" ? "gas_exchange" : kind) ? (
        <p role="alert" className="rounded-md border border-alert bg-alert-wash p-3 text-sm font-semibold text-alert">
          This test cannot be recorded until the readiness answers allow it: saving it will be refused.
        </p>
      ) : null}
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <div className="card">
          {kind === "gas" ? (
            <GasExchangeUpload athleteId={id} defaultMassKg={profile.bodyMassKg} today={today} />
          ) : null}
          {kind === "talk" ? <TalkTestForm athleteId={id} today={today} /> : null}
          {kind === "submax" ? <SubmaxForm athleteId={id} today={today} massKg={profile.bodyMassKg} age={age} /> : null}
          {kind === "manual" ? <ManualThresholdsForm athleteId={id} today={today} /> : null}
        </div>
        <StopSignChecklist />
      </div>
    </div>
  );
}
