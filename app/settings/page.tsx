import { requirePageActor } from "@/features/access/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { ProfileForm } from "@/features/athletes/components/ProfileForm";
import {
  CalendarFeedSettings,
  CoachDigestSettings,
  MessageEmailSettings,
} from "@/features/messages/components/EmailSettings";
import { getNotificationSettings } from "@/features/messages/server/preferences";
import { FormNotice } from "@/features/platform/components/form-bits";
import { publicOrigin } from "@/features/platform/server/origin";
import { AccountSettings } from "@/features/auth/components/AccountSettings";
import { DisplaySettings } from "@/features/auth/components/DisplaySettings";
import { localDate } from "@/features/platform/lib/dates";

export const metadata = { title: "Settings" };

export default async function SettingsPage({ searchParams }: { searchParams: Promise<{ welcome?: string }> }) {
  const actor = await requirePageActor("/settings");
  const { welcome } = await searchParams;
  const isAthlete = actor.memberships.some((m) => m.role === "athlete");
  const isCoach = actor.memberships.some((m) => m.role !== "athlete");
  const [settings, profile] = await Promise.all([
    getNotificationSettings(actor),
    isAthlete ? getAthleteProfile(actor, actor.userId).then((p) => p.profile) : Promise.resolve(null),
  ]);
  return (
    <div className="mx-auto max-w-2xl space-y-4">
      <h1 className="text-2xl font-bold">Settings</h1>
      {welcome ? (
        <FormNotice>
          Welcome to your squad. Set your time zone and when you want session reminders, then save.
        </FormNotice>
      ) : null}
      {profile ? (
        <section className="card space-y-2" aria-labelledby="profile-h">
          <h2 id="profile-h" className="text-lg font-bold">
            Your profile and reminders
          </h2>
          <p className="text-sm text-ink-soft">
            Session and retest reminders come by e-mail at the time you choose here, in your time zone.
          </p>
          <ProfileForm athleteId={actor.userId} initial={profile} isSelf />
        </section>
      ) : null}
      {isCoach ? (
        <section className="card space-y-2" aria-labelledby="digest-h">
          <h2 id="digest-h" className="text-lg font-bold">
            Coach e-mail
          </h2>
          <CoachDigestSettings initial={{ timeZone: settings.timeZone, coachDigest: settings.coachDigest }} />
        </section>
      ) : null}
      {isAthlete ? (
        <section className="card space-y-2" aria-labelledby="feed-h">
          <h2 id="feed-h" className="text-lg font-bold">
            Calendar feed
          </h2>
          <CalendarFeedSettings
            initialUrl={settings.calendarToken ? `${publicOrigin()}/api/calendar/${settings.calendarToken}.ics` : null}
          />
        </section>
      ) : null}
      {isAthlete || isCoach ? (
        <section className="card space-y-2" aria-labelledby="messages-h">
          <h2 id="messages-h" className="text-lg font-bold">
            Messages
          </h2>
          <MessageEmailSettings initial={settings.messageEmails} />
        </section>
      ) : null}
      {!isAthlete && !isCoach ? <p className="card">Join a squad to set up reminders and e-mail.</p> : null}
      <section className="card space-y-2" aria-labelledby="units-h">
        <h2 id="units-h" className="text-lg font-bold">
          Units and dates
        </h2>
        <DisplaySettings
          initial={{ units: actor.units, dateStyle: actor.dateStyle }}
          example={localDate(new Date(), settings.timeZone)}
        />
      </section>
      <section className="card space-y-2" aria-labelledby="account-h">
        <h2 id="account-h" className="text-lg font-bold">
          Your account
        </h2>
        <AccountSettings name={actor.name} email={actor.email} />
      </section>
    </div>
  );
}
