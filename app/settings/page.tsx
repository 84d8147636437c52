import { requirePageActor } from "@/features/auth/server/current";
import { getAthleteProfile } from "@/features/athletes/server/profile";
import { ProfileForm } from "@/features/athletes/components/ProfileForm";
import { FormNotice } from "@/features/platform/components/form-bits";

export const metadata = { title: "Settings" };

export default async function SettingsPage({ searchParams }: { searchParams: Promise<{ welcome?: string }> }) {
  const actor = await requirePageActor("/settings");
  const { welcome } = await searchParams;
  if (!actor.memberships.some((m) => m.role === "athlete")) {
    return (
      <div className="mx-auto max-w-lg card">
        <h1 className="text-xl font-bold">Settings</h1>
        <p className="mt-2">Profile and reminder settings belong to athletes. Your account is a coach account.</p>
      </div>
    );
  }
  const { profile } = await getAthleteProfile(actor, actor.userId);
  return (
    <div className="mx-auto max-w-2xl space-y-4">
      <h1 className="text-2xl font-bold">Your profile and reminders</h1>
      {welcome ? (
        <FormNotice>Welcome to your squad. Set your time zone and when you want session reminders, then save.</FormNotice>
      ) : null}
      <div className="card">
        <ProfileForm athleteId={actor.userId} initial={profile} isSelf />
      </div>
    </div>
  );
}
