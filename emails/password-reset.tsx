import { EmailLayout } from "./layout";

export interface PasswordResetEmailProps {
  name: string;
  url: string;
}

export const passwordResetSubject = "Reset your Tidemark password";

export function PasswordResetEmail(p: PasswordResetEmailProps) {
  return (
    <EmailLayout title={passwordResetSubject}>
      <p>Hello {p.name},</p>
      <p>Someone asked to reset the password of your Tidemark account. If it was you, choose a new password here:</p>
      <p>
        <a href={p.url} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Choose a new password
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        The link expires in one hour. If it was not you, ignore this message.
      </p>
    </EmailLayout>
  );
}

export function passwordResetText(p: PasswordResetEmailProps): string {
  return [
    `Hello ${p.name},`,
    "",
    "Someone asked to reset the password of your Tidemark account. If it was you, choose a new password here:",
    p.url,
    "",
    "The link expires in one hour. If it was not you, ignore this message.",
  ].join("\n");
}
