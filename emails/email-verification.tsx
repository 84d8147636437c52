import { EmailLayout } from "./layout";

export interface EmailVerificationProps {
  name: string;
  url: string;
}

export const emailVerificationSubject = "Confirm your address for Tidemark";

export function EmailVerificationEmail(p: EmailVerificationProps) {
  return (
    <EmailLayout title={emailVerificationSubject}>
      <p>Hello {p.name},</p>
      <p>An account on Tidemark was opened with this address. If it was you, confirm the address to start using it:</p>
      <p>
        <a href={p.url} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Confirm my address
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        The link expires in 24 hours. If it was not you, ignore this message: the account stays locked until the address
        is confirmed.
      </p>
    </EmailLayout>
  );
}

export function emailVerificationText(p: EmailVerificationProps): string {
  return [
    `Hello ${p.name},`,
    "",
    "An account on Tidemark was opened with this address. If it was you, confirm the address to start using it:",
    p.url,
    "",
    "The link expires in 24 hours. If it was not you, ignore this message: the account stays locked until the address is confirmed.",
  ].join("\n");
}

export const existingAccountSubject = "Someone tried to open a Tidemark account with your address";

export function ExistingAccountEmail(p: { name: string }) {
  return (
    <EmailLayout title={existingAccountSubject}>
      <p>Hello {p.name},</p>
      <p>
        Someone tried to open a new Tidemark account with this address. You already have one, so nothing was created. If
        it was you, sign in, or choose a new password from the sign-in page. If it was not you, you need do nothing.
      </p>
    </EmailLayout>
  );
}

export function existingAccountText(p: { name: string }): string {
  return [
    `Hello ${p.name},`,
    "",
    "Someone tried to open a new Tidemark account with this address. You already have one, so nothing was created. If it was you, sign in, or choose a new password from the sign-in page. If it was not you, you need do nothing.",
  ].join("\n");
}

export function SignInPausedEmail(p: { name: string; failures: number; minutes: number }) {
  return (
    <EmailLayout title="Sign-in to your Tidemark account is paused">
      <p>Hello {p.name},</p>
      <p>
        Someone typed a wrong password for your Tidemark account {p.failures} times in a row, so sign-in to it is paused
        for {p.minutes} minutes.
      </p>
      <p>
        If it was you, wait and try again, or choose a new password with &ldquo;Forgot your password?&rdquo; on the
        sign-in page.
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        If it was not you, your account is safe as long as nobody knows the password; choosing a new one is a good idea.
      </p>
    </EmailLayout>
  );
}
