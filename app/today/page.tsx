import Link from "next/link";
import { requirePageActor } from "@/features/auth/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { SPORT_LABELS } from "@/features/athletes/schemas";
import { describeMe } from "@/features/squads/server/squads";
import { ROLE_LABELS } from "@/features/squads/schemas";

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
        <Link href="/home" className="btn-quiet">Go to your home</Link>
      </div>
    );
  }
  const { profile } = await getAthleteProfile(actor, actor.userId);
  const today = new Intl.DateTimeFormat("en-GB", { timeZone: profile.timeZone, weekday: "long", day: "numeric", month: "long" }).format(new Date());
  return (
    <div className="space-y-6">
      <div>
        <p className="text-sm font-semibold uppercase tracking-widest text-tide">Today · {today}</p>
        <h1 className="text-3xl font-bold">Hello, {actor.name.split(" ")[0]}</h1>
      </div>
      <section className="card" aria-labelledby="sessions-heading">
        <h2 id="sessions-heading" className="text-lg font-bold">Your sessions</h2>
        <p className="mt-2 text-ink-soft">Today&apos;s sessions with targets in your own heart rate, power or pace come to this page soon. Meanwhile your coach&apos;s plan is on your calendar.</p>
        <Link href={`/athletes/${actor.userId}/plan`} className="btn-quiet mt-3">My plan and calendar</Link>
      </section>
      <div className="grid gap-6 md:grid-cols-2">
        <section className="card" aria-labelledby="squad-heading">
          <h2 id="squad-heading" className="text-lg font-bold">Your squad</h2>
          <ul className="mt-2 space-y-1">
            {athleteSquads.map((s) => (
              <li key={s.id}>
                {s.name} <span className="text-sm text-ink-soft">({ROLE_LABELS[s.role]})</span>
              </li>
            ))}
          </ul>
        </section>
        <section className="card" aria-labelledby="profile-heading">
          <h2 id="profile-heading" className="text-lg font-bold">Your profile</h2>
          <dl className="mt-2 grid grid-cols-2 gap-x-4 gap-y-1 text-sm">
            <dt className="text-ink-soft">Sports</dt>
            <dd>{profile.sports.length ? profile.sports.map((s) => SPORT_LABELS[s]).join(", ") : "not set"}</dd>
            <dt className="text-ink-soft">Resting heart rate</dt>
            <dd className="num">{profile.restingHrBpm != null ? `${profile.restingHrBpm} bpm` : "not set"}</dd>
            <dt className="text-ink-soft">Maximal heart rate</dt>
            <dd className="num">{profile.maxHrBpm != null ? `${profile.maxHrBpm} bpm` : "not set"}</dd>
            <dt className="text-ink-soft">Body mass</dt>
            <dd className="num">{profile.bodyMassKg != null ? `${profile.bodyMassKg} kg` : "not set"}</dd>
            <dt className="text-ink-soft">Time zone</dt>
            <dd>{profile.timeZone}</dd>
            <dt className="text-ink-soft">Session reminders</dt>
            <dd className="num">
              {profile.reminderTiming === "off" ? "off" : `${profile.reminderTiming === "evening_before" ? "evening before" : "morning of"}, ${profile.reminderTime}`}
            </dd>
          </dl>
          <Link href="/settings" className="btn-quiet mt-4">Edit profile and reminders</Link>
        </section>
      </div>
    </div>
  );
}
