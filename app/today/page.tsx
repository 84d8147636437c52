import Link from "next/link";
import { requirePageActor } from "@/features/access/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { SPORT_LABELS } from "@/features/platform/lib/sports";
import { describeMe } from "@/features/squads/server/squads";
import { ROLE_LABELS } from "@/features/squads/schemas";
import { SessionCard } from "@/features/logs/components/SessionCard";
import { ThreadPanel } from "@/features/threads/components/ThreadPanel";
import { UnplannedLogForm } from "@/features/logs/components/UnplannedLogForm";
import { LOG_STATUS_LABELS } from "@/features/logs/schemas";
import { sessionCards } from "@/features/logs/server/cards";
import { formatDay } from "@/features/platform/lib/date-format";
import { localDate } from "@/features/platform/lib/dates";
import { addDays } from "@/features/platform/lib/days";
import { nextRetestOf } from "@/features/planning/server";
import { readinessOf } from "@/features/athlete-tests/server/screening";
import { ReadinessBanner } from "@/features/athlete-tests/components/ReadinessBanner";

export const metadata = { title: "Today" };

export default async function TodayPage() {
  const actor = await requirePageActor("/today");
  const me = await describeMe(actor);
  const athleteSquads = me.squads.filter((s) => s.role === "athlete");
  if (athleteSquads.length === 0) {
    return (
      <div className="mx-auto max-w-lg card space-y-3">
        <h1 className="text-xl font-bold">Today is for athletes</h1>
        <p>You are not an athlete of any squad. Athletes join through an invitation from their coach.</p>
        <Link href="/home" className="btn-quiet">
          Go to your home
        </Link>
      </div>
    );
  }
  const { profile } = await getAthleteProfile(actor, actor.userId);
  const today = localDate(new Date(), profile.timeZone);
  const [{ cards, unplanned }, retest, ready] = await Promise.all([
    sessionCards(actor, actor.userId, today, addDays(today, 6)),
    nextRetestOf(actor, actor.userId, today),
    readinessOf(actor.userId),
  ]);
  const todays = cards.filter((c) => c.date === today);
  const ahead = cards.filter((c) => c.date > today);
  // A calendar day is already local to the athlete: written with its weekday, in the athlete's date style.
  const dayName = (iso: string) => formatDay(iso, actor.dateStyle, { weekday: true });
  const retestIn = retest ? Math.round((Date.parse(retest.date) - Date.parse(today)) / 86_400_000) : null;
  return (
    <div className="space-y-6">
      <div>
        <p className="text-sm font-semibold uppercase tracking-widest text-tide">Today · {dayName(today)}</p>
        <h1 className="text-3xl font-bold">Hello, {actor.name.split(" ")[0]}</h1>
      </div>
      <ReadinessBanner readiness={ready} athleteId={actor.userId} context="today" />
      <section aria-labelledby="sessions-heading" className="space-y-3">
        <h2 id="sessions-heading" className="text-lg font-bold">
          Today&apos;s sessions
        </h2>
        {todays.length === 0 ? (
          <p className="card text-ink-soft">
            Nothing is planned for today: a rest day, or log something you did below.
          </p>
        ) : (
          todays.map((c) => <SessionCard key={c.id} s={c} canLog units={actor.units} maxHrBpm={profile.maxHrBpm} />)
        )}
      </section>
      <div className="grid gap-6 md:grid-cols-2">
        <section className="card" aria-labelledby="week-heading">
          <h2 id="week-heading" className="text-lg font-bold">
            The week ahead
          </h2>
          {ahead.length === 0 ? (
            <p className="mt-2 text-ink-soft">Nothing planned in the next six days yet.</p>
          ) : (
            <ul className="mt-2 divide-y divide-rule/70">
              {ahead.map((c) => (
                <li key={c.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2 text-sm">
                  <span>
                    <span className="font-semibold">{dayName(c.date)}</span> · {c.kind === "retest" ? "⟳ " : ""}
                    {c.title}
                  </span>
                  <span className="num text-ink-soft">
                    {Math.round(c.totalS / 60)} min{c.log ? ` · ${LOG_STATUS_LABELS[c.log.status]}` : ""}
                  </span>
                </li>
              ))}
            </ul>
          )}
          <Link prefetch={false} href={`/athletes/${actor.userId}/plan`} className="btn-quiet mt-3">
            My plan and calendar
          </Link>
        </section>
        <section className="card" aria-labelledby="retest-heading">
          <h2 id="retest-heading" className="text-lg font-bold">
            Next retest
          </h2>
          {retest ? (
            <>
              <p className="mt-2">
                <span className="font-semibold">{dayName(retest.date)}</span>{" "}
                <span className="num text-ink-soft">
                  ({retestIn === 0 ? "today" : `in ${retestIn} day${retestIn === 1 ? "" : "s"}`})
                </span>
              </p>
              <p className="mt-1 text-sm text-ink-soft">
                Come rested: an easy day before, no hard training in the last 48 hours, your usual meal 2–3 hours ahead.
                Answer the readiness questions before the test.
              </p>
              <Link prefetch={false} href={`/athletes/${actor.userId}/screening`} className="btn-quiet mt-3">
                Readiness questions
              </Link>
            </>
          ) : (
            <p className="mt-2 text-ink-soft">No retest is planned yet; your coach places one every 12–16 weeks.</p>
          )}
        </section>
      </div>
      <section className="card space-y-3" aria-labelledby="unplanned-heading">
        <h2 id="unplanned-heading" className="text-lg font-bold">
          Log an unplanned session
        </h2>
        {unplanned.length ? (
          <div className="space-y-2">
            <p className="text-sm text-ink-soft">Logged this week without a plan:</p>
            <ul className="space-y-2">
              {unplanned.map((u) => (
                <li key={u.id} className="space-y-1 text-sm">
                  <p>
                    <span className="font-semibold">{u.title}</span> · {dayName(u.date)} ·{" "}
                    <span className="num">{Math.round(u.durationMin ?? 0)} min</span>
                  </p>
                  <ThreadPanel kind="log" id={u.id} label="Messages about this log" />
                </li>
              ))}
            </ul>
          </div>
        ) : null}
        <UnplannedLogForm
          athleteId={actor.userId}
          today={today}
          defaultSport={profile.sports[0] ?? "running"}
          units={actor.units}
        />
      </section>
      <div className="grid gap-6 md:grid-cols-2">
        <section className="card" aria-labelledby="squad-heading">
          <h2 id="squad-heading" className="text-lg font-bold">
            Your squad
          </h2>
          <ul className="mt-2 space-y-1">
            {athleteSquads.map((s) => (
              <li key={s.id}>
                {s.name} <span className="text-sm text-ink-soft">({ROLE_LABELS[s.role]})</span>
              </li>
            ))}
          </ul>
          <Link prefetch={false} href={`/athletes/${actor.userId}`} className="btn-quiet mt-3">
            My zones, tests and load
          </Link>
        </section>
        <section className="card" aria-labelledby="profile-heading">
          <h2 id="profile-heading" className="text-lg font-bold">
            Your profile
          </h2>
          <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
            <dt className="text-ink-soft">Sports</dt>
            <dd>{profile.sports.length ? profile.sports.map((s) => SPORT_LABELS[s]).join(", ") : "not set"}</dd>
            <dt className="text-ink-soft">Resting heart rate</dt>
            <dd className="num">{profile.restingHrBpm != null ? `${profile.restingHrBpm} bpm` : "not set"}</dd>
            <dt className="text-ink-soft">Maximal heart rate</dt>
            <dd className="num">{profile.maxHrBpm != null ? `${profile.maxHrBpm} bpm` : "not set"}</dd>
            <dt className="text-ink-soft">Time zone</dt>
            <dd>{profile.timeZone}</dd>
            <dt className="text-ink-soft">Session reminders</dt>
            <dd className="num">
              {profile.reminderTiming === "off"
                ? "off"
                : `${profile.reminderTiming === "evening_before" ? "evening before" : "morning of"}, ${profile.reminderTime}`}
            </dd>
          </dl>
          <Link prefetch={false} href="/settings" className="btn-quiet mt-4">
            Edit profile and reminders
          </Link>
        </section>
      </div>
    </div>
  );
}
