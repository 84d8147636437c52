import Link from "next/link";
import { notFound } from "next/navigation";
import { canCoachAthlete } from "@/features/access/lib/rules";
import { requirePageActor } from "@/features/access/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { ProfileForm } from "@/features/athletes/components/ProfileForm";
import { getScreening } from "@/features/athlete-tests/server/screening";
import { listTests } from "@/features/athlete-tests/server/tests";
import { HttpError } from "@/features/platform/server/http";
import { ZoneSetList, ZonesInForce } from "@/features/zones/components/ZoneHistory";
import { ThreadPanel } from "@/features/threads/components/ThreadPanel";
import { HandOverManagedAthlete } from "@/features/squads/components/ManagedAthleteForms";
import { isPlaceholderEmail, shownEmail } from "@/features/squads/lib/managed";
import { athleteThreads } from "@/features/threads/server";
import { getZones } from "@/features/zones/server/zone-sets";
import { membershipsOfAthlete } from "@/features/access/server/permissions";
import { LoadChart } from "@/features/load/components/LoadChart";
import { athleteDrift, athleteLoad } from "@/features/load/server/load";
import { formatDay, localiseDates } from "@/features/platform/lib/date-format";
import { localDate } from "@/features/platform/lib/dates";
import { addDays } from "@/features/platform/lib/days";
import { ReadinessBanner } from "@/features/athlete-tests/components/ReadinessBanner";

export const metadata = { title: "Athlete" };

const KIND_LABELS = {
  gas_exchange: "Gas-exchange test",
  talk: "Talk test",
  submax: "Submaximal estimate",
  manual: "Thresholds entered by hand",
} as const;

export default async function AthletePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requirePageActor(`/athletes/${id}`);
  const data = await getAthleteProfile(actor, id).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  const today = localDate(new Date(), data.profile.timeZone);
  const [tests, zones, screening, memberships, load, drift, threads] = await Promise.all([
    listTests(actor, id),
    getZones(actor, id),
    getScreening(actor, id),
    membershipsOfAthlete(id),
    athleteLoad(actor, id, addDays(today, -83), today),
    athleteDrift(actor, id, today),
    athleteThreads(actor, id),
  ]);
  const coaches = canCoachAthlete(actor, { userId: id, memberships });
  return (
    <div className="space-y-6">
      <div>
        <p className="text-sm font-semibold uppercase tracking-widest text-tide">Athlete</p>
        <h1 className="text-2xl font-bold">{data.athlete.name}</h1>
        <p className="text-sm text-ink-soft">
          {shownEmail(data.athlete.email)}
          {data.athlete.managed && !isPlaceholderEmail(data.athlete.email)
            ? " (handed over; waiting for the athlete to choose a password)"
            : ""}
        </p>
        <Link className="btn mt-3" href={`/athletes/${id}/plan`}>
          Plan and calendar
        </Link>
      </div>
      {coaches && data.athlete.managed ? <HandOverManagedAthlete athleteId={id} name={data.athlete.name} /> : null}
      <section id="messages" className="card space-y-3" aria-labelledby="messages-heading">
        <h2 id="messages-heading" className="text-lg font-bold">
          Messages
        </h2>
        {threads.length ? (
          <ul className="space-y-3">
            {threads.map((t) => (
              <li key={`${t.subject.kind}:${t.subject.id}`} className="space-y-1">
                <p className="text-sm">
                  <span className="font-semibold">{t.title}</span> · {formatDay(t.date, actor.dateStyle)} ·{" "}
                  {t.subject.kind === "session" ? "planned session" : "log"} · {t.messages}{" "}
                  {t.messages === 1 ? "message" : "messages"}
                  {t.unread ? <span className="ml-1 font-semibold text-alert">{t.unread} new</span> : null}
                </p>
                <p className="line-clamp-1 text-sm text-ink-soft">
                  {t.lastAuthorName}: {t.lastBody}
                </p>
                <ThreadPanel
                  kind={t.subject.kind}
                  id={t.subject.id}
                  label={t.unread ? "Read and answer" : "Open the conversation"}
                />
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-ink-soft">
            No messages yet. Every planned session and every log has its own conversation: open a session on the plan
            (or on today&apos;s page) to write one.
          </p>
        )}
      </section>
      <section className="card space-y-3" aria-labelledby="load-heading">
        <h2 id="load-heading" className="text-lg font-bold">
          Load, last 12 weeks
        </h2>
        {drift?.drifted ? (
          <p
            role="alert"
            className="rounded-md border border-alert/40 bg-alert-wash p-3 text-sm text-alert"
            data-testid="drift"
          >
            <strong>Zone drift ({drift.sport.replaceAll("_", " ")}):</strong>{" "}
            {localiseDates(drift.message, actor.dateStyle)} Based on {drift.baselineSessions} sessions after the zones
            were set and {drift.recentSessions} recent ones.
          </p>
        ) : null}
        {load.weeks.some((w) => w.load > 0 || w.doneMin > 0) ? (
          <LoadChart report={load} dateStyle={actor.dateStyle} />
        ) : (
          <p className="text-ink-soft">No logged sessions in the last 12 weeks yet.</p>
        )}
        {load.trimpMethod ? (
          <p className="text-xs text-ink-soft">
            TRIMP:{" "}
            {load.trimpMethod === "banister"
              ? "Banister's (average heart rate between resting and maximal, weighted by sex)"
              : "Edwards' (minutes in five heart-rate bands)"}
            , the one method this athlete&apos;s files are scored with.
            {load.trimpOtherMethod
              ? ` ${load.trimpOtherMethod} log(s) scored otherwise are left out of the weekly TRIMP.`
              : ""}
          </p>
        ) : null}
        <div className="text-sm" data-testid="downloads">
          <p>Download (CSV opens in any spreadsheet program; Excel workbooks keep numbers as numbers):</p>
          <ul className="mt-1 space-y-1">
            {(
              [
                ["plan", "Plan, a year back and ahead"],
                ["logs", "Logs, last year"],
                ["zones", "Zone history"],
              ] as const
            ).map(([file, label]) => (
              <li key={file}>
                {label}:{" "}
                <a
                  className="font-semibold text-tide underline"
                  href={`/api/athletes/${id}/export/${file}.csv`}
                  aria-label={`${label} as CSV`}
                  download
                >
                  CSV
                </a>
                {" · "}
                <a
                  className="font-semibold text-tide underline"
                  href={`/api/athletes/${id}/export/${file}.xlsx`}
                  aria-label={`${label} as Excel workbook`}
                  download
                >
                  Excel (.xlsx)
                </a>
              </li>
            ))}
          </ul>
        </div>
      </section>
      <section className="card space-y-4" aria-labelledby="zones-heading">
        <h2 id="zones-heading" className="text-lg font-bold">
          Zones in force today
        </h2>
        <ZonesInForce
          units={actor.units}
          inForce={zones.inForce}
          emptyText="No zones yet. Record a test to derive them."
        />
        <ZoneSetList units={actor.units} history={zones.history} canChoose={coaches} />
      </section>
      <section className="card space-y-3" aria-labelledby="tests-heading">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 id="tests-heading" className="text-lg font-bold">
            Tests
          </h2>
          {coaches ? (
            <nav aria-label="Record a test" className="flex flex-wrap gap-2 text-sm">
              <Link className="btn" href={`/athletes/${id}/tests/new?kind=gas`}>
                Upload a gas-exchange test
              </Link>
              <Link className="btn-quiet" href={`/athletes/${id}/tests/new?kind=talk`}>
                Talk test
              </Link>
              <Link className="btn-quiet" href={`/athletes/${id}/tests/new?kind=submax`}>
                Submaximal estimate
              </Link>
              <Link className="btn-quiet" href={`/athletes/${id}/tests/new?kind=manual`}>
                Enter thresholds
              </Link>
            </nav>
          ) : null}
        </div>
        <ReadinessBanner readiness={screening.readiness} athleteId={id} context="athlete" />
        <p className="text-sm">
          Readiness screening:{" "}
          {screening.latest
            ? `answered on ${formatDay(new Date(screening.latest.date).toISOString().slice(0, 10), actor.dateStyle)}${screening.latest.anyYes ? " — at least one yes" : " — all no"}`
            : "not answered yet"}
          .{" "}
          <Link href={`/athletes/${id}/screening`} className="font-semibold text-tide underline">
            {screening.latest ? "Review or update" : "Answer the questions"}
          </Link>
        </p>
        {tests.length === 0 ? (
          <p className="text-ink-soft">No tests recorded yet.</p>
        ) : (
          <ul className="divide-y divide-rule">
            {tests.map((t) => (
              <li key={t.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
                <Link href={`/tests/${t.id}`} className="font-semibold text-tide hover:underline">
                  {KIND_LABELS[t.kind]} · {formatDay(t.date, actor.dateStyle)}
                </Link>
                <span className="text-sm text-ink-soft">
                  {t.protocol}
                  {t.adjustedAt ? " · thresholds adjusted" : ""}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
      <section className="card" aria-labelledby="profile-heading">
        <h2 id="profile-heading" className="mb-4 text-lg font-bold">
          Profile
        </h2>
        <ProfileForm athleteId={data.athlete.id} initial={data.profile} isSelf={actor.userId === id} />
      </section>
    </div>
  );
}
