import Link from "next/link";
import { currentActor } from "@/features/access/server/current";
import { SignOutButton } from "@/features/auth/components/SignOutButton";
import { AcceptButton, SignUpAndAccept } from "@/features/squads/components/AcceptInvitation";
import { ROLE_LABELS } from "@/features/squads/schemas";
import { tokenParam } from "@/features/platform/lib/params";
import { accountExists, lookupInvitation } from "@/features/squads/server/squads";

export const metadata = { title: "Invitation" };

function Frame({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="mx-auto max-w-md">
      <h1 className="text-2xl font-bold">{title}</h1>
      <div className="card mt-6 space-y-4">{children}</div>
    </div>
  );
}

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const parsed = tokenParam.safeParse(await params);
  const invitation = parsed.success ? await lookupInvitation(parsed.data.token) : null;
  if (!parsed.success || !invitation) {
    return (
      <Frame title="This invitation link is not valid">
        <p>Check that you opened the whole link from the e-mail, or ask your coach to send a new invitation.</p>
      </Frame>
    );
  }
  const token = parsed.data.token;
  if (invitation.state !== "open") {
    const text = {
      accepted: "This invitation has already been used. If it was you, sign in to continue.",
      expired: "This invitation has expired. Ask your coach to send a new one.",
      revoked: "This invitation was withdrawn. Ask your coach to send a new one.",
    }[invitation.state];
    return (
      <Frame title="This invitation can no longer be used">
        <p>{text}</p>
        <Link href="/sign-in" className="btn-quiet">
          Go to sign-in
        </Link>
      </Frame>
    );
  }
  const role = ROLE_LABELS[invitation.role];
  const intro = (
    <p>
      You are invited to join <strong>{invitation.squadName}</strong> as {role === "athlete" ? "an" : "a"} {role}, with
      the address <strong>{invitation.email}</strong>.
    </p>
  );
  const actor = await currentActor();
  if (actor) {
    if (actor.email.toLowerCase() !== invitation.email.toLowerCase()) {
      return (
        <Frame title="Join a squad">
          {intro}
          <p role="alert">
            You are signed in as {actor.email}. Sign out, then open this link again to join with {invitation.email}.
          </p>
          <SignOutButton />
        </Frame>
      );
    }
    return (
      <Frame title="Join a squad">
        {intro}
        <AcceptButton token={token} role={invitation.role} />
      </Frame>
    );
  }
  if (await accountExists(invitation.email)) {
    return (
      <Frame title="Join a squad">
        {intro}
        <p>You already have a Tidemark account. Sign in, and you will come back here to join.</p>
        <Link href={`/sign-in?next=${encodeURIComponent(`/invite/${token}`)}`} className="btn">
          Sign in to join
        </Link>
      </Frame>
    );
  }
  return (
    <Frame title="Join a squad">
      {intro}
      <p className="text-sm text-ink-soft">
        Create your account: choose a password, then open the link we send to {invitation.email} to confirm it is yours.
        It brings you back here to join.
      </p>
      <SignUpAndAccept token={token} email={invitation.email} />
    </Frame>
  );
}
