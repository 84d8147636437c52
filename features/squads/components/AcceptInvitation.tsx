"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { SignUpForm } from "@/features/auth/components/SignUpForm";
import { FormAlert } from "@/features/platform/components/form-bits";
import { acceptInvitationRequest } from "../api";

function destination(role: string): string {
  return role === "athlete" ? "/settings?welcome=1" : "/roster";
}

export function AcceptButton({ token, role }: { token: string; role: string }) {
  const router = useRouter();
  const [error, setError] = useState<string>();
  const [busy, setBusy] = useState(false);
  return (
    <div className="space-y-3">
      <FormAlert>{error}</FormAlert>
      <button
        type="button"
        className="btn"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(undefined);
          const result = await acceptInvitationRequest(token);
          if (!result.ok) {
            setBusy(false);
            return setError(result.error);
          }
          router.push(destination(role));
          router.refresh();
        }}
      >
        {busy ? "Joining…" : "Join the squad"}
      </button>
    </div>
  );
}

/** Sign-up from an invitation: the confirmation link signs in and brings the person back here to join. */
export function SignUpAndAccept({ token, email }: { token: string; email: string }) {
  return <SignUpForm fixedEmail={email} callbackURL={`/invite/${token}`} />;
}
