import Link from "next/link";
import { notFound } from "next/navigation";
import { canCoachAthlete } from "@/features/access/lib/rules";
import { membershipsOfAthlete } from "@/features/access/server/permissions";
import { requirePageActor } from "@/features/access/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { HttpError } from "@/features/platform/server/http";
import { PlanCalendar } from "@/features/planning/components/PlanCalendar";
import { SeasonFormLoader } from "@/features/planning/components/SeasonFormLoader";
import { SeasonRibbon } from "@/features/planning/components/SeasonRibbon";
import { SeasonWeekEditor } from "@/features/planning/components/SeasonWeekEditor";
import { type SeasonWeek } from "@/features/planning/lib/season";
import { mondayOf } from "@/features/platform/lib/days";
import { listSeasons, listSessions, weekSummaries, weekSummariesJson } from "@/features/planning/server";
import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import { planKeys } from "@/features/planning/query-keys";
import { addDays } from "@/features/platform/lib/days";
import { listTemplates } from "@/features/planning/server/templates";
import { isoDate } from "@/features/planning/schemas";
import { readinessOf } from "@/features/athlete-tests/server/screening";
import { ReadinessBanner } from "@/features/athlete-tests/components/ReadinessBanner";

export const metadata = { title: "Plan" };

export default async function PlanPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ week?: string }>;
}) {
  const { id } = await params;
  const { week } = await searchParams;
  const actor = await requirePageActor(`/athletes/${id}/plan`);
  const data = await getAthleteProfile(actor, id).catch((e) => {
    if (e instanceof HttpError && e.status === 404) notFound();
    throw e;
  });
  const memberships = await membershipsOfAthlete(id);
  const canEdit = canCoachAthlete(actor, { userId: id, memberships });
  const athleteSquads = new Set(memberships.filter((m) => m.role === "athlete").map((m) => m.squadId));
  const [seasons, templates, ready] = await Promise.all([
    listSeasons(actor, id),
    canEdit ? listTemplates(actor) : Promise.resolve([]),
    readinessOf(id),
  ]);
  const today = new Date().toISOString().slice(0, 10);
  const current =
    seasons.find((s) => {
      const w = s.weeks as unknown as SeasonWeek[];
      return w.length && w[0]!.weekStart <= today && w[w.length - 1]!.weekStart >= mondayOf(today);
    }) ?? seasons.at(-1);
  const seasonWeeks = (current?.weeks ?? []) as unknown as SeasonWeek[];
  const summaries = seasonWeeks.length
    ? await weekSummaries(actor, id, seasonWeeks[0]!.weekStart, seasonWeeks[seasonWeeks.length - 1]!.weekStart)
    : [];
  const initialDate = week && isoDate.safeParse(week).success ? week : today;
  // The calendar's first week, fetched here and handed to the browser with the page, so that the page settles without
  // asking for it again (the same keys and answers as the client's queries).
  const firstFrom = mondayOf(initialDate),
    firstTo = addDays(firstFrom, 6);
  const [firstSessions, firstWeeks] = await Promise.all([
    listSessions(actor, id, firstFrom, firstTo),
    weekSummariesJson(actor, id, firstFrom, firstTo),
  ]);
  const prefetched = new QueryClient();
  prefetched.setQueryData(planKeys.sessions(id, firstFrom, firstTo), JSON.parse(JSON.stringify(firstSessions)));
  prefetched.setQueryData(planKeys.weeks(id, firstFrom, firstTo), JSON.parse(firstWeeks));
  const openWeek = week ? seasonWeeks.find((w) => w.weekStart === mondayOf(initialDate)) : undefined;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-semibold uppercase tracking-widest text-tide">
            {/* Fetched when followed: the page's own data comes with it, and nothing more is asked for ahead. */}
            <Link href={`/athletes/${id}`} prefetch={false} className="hover:underline">
              {data.athlete.name}
            </Link>
          </p>
          <h1 className="text-2xl font-bold">Plan</h1>
        </div>
        {canEdit ? (
          <Link href="/templates" prefetch={false} className="btn-quiet">
            Session templates
          </Link>
        ) : null}
      </div>
      <ReadinessBanner readiness={ready} athleteId={id} context="plan" />
      {current ? (
        <>
          <a
            href="#plan-calendar"
            className="sr-only focus:not-sr-only focus:inline-block focus:rounded focus:bg-paper focus:p-2"
          >
            Skip the season&apos;s weeks to the calendar
          </a>
          <div className="card">
            <SeasonRibbon athleteId={id} name={current.name} weeks={seasonWeeks} initialSummaries={summaries} />
          </div>
          {canEdit && openWeek ? (
            <div className="card">
              <SeasonWeekEditor
                key={`${openWeek.weekStart}-${current.version}`}
                athleteId={id}
                seasonId={current.id}
                seasonVersion={current.version}
                week={openWeek}
              />
            </div>
          ) : null}
        </>
      ) : canEdit ? (
        <section className="card space-y-3" aria-labelledby="season-h">
          <h2 id="season-h" className="font-bold">
            No season yet
          </h2>
          <p className="text-sm text-ink-soft">
            Generate a season toward the athlete&apos;s event: blocks, loading and unloading weeks, volume targets,
            intensity budgets and retests. Everything can be edited afterwards.
          </p>
          <SeasonFormLoader athleteId={id} today={today} sport={data.profile.sports[0] ?? "running"} />
        </section>
      ) : (
        <p className="text-ink-soft">No season planned yet.</p>
      )}
      <HydrationBoundary state={dehydrate(prefetched)}>
        <PlanCalendar
          athleteId={id}
          templates={templates
            .filter((t) => athleteSquads.has(t.squadId))
            .map((t) => ({ id: t.id, name: t.name, sport: t.sport, totalS: t.totalS, minutesByZone: t.minutesByZone }))}
          initialDate={initialDate}
          canEdit={canEdit}
          athleteSports={data.profile.sports}
        />
      </HydrationBoundary>
    </div>
  );
}
