import { EmailLayout } from "./layout";

/** To the current address: approve moving the account to a new one (nothing changes until then). */
export interface EmailChangeConfirmationProps {
  name: string;
  newEmail: string;
  url: string;
}

export const emailChangeConfirmationSubject = "Approve the new address of your Tidemark account";

export function EmailChangeConfirmationEmail(p: EmailChangeConfirmationProps) {
  return (
    <EmailLayout title={emailChangeConfirmationSubject}>
      <p>Hello {p.name},</p>
      <p>
        Someone signed in to your Tidemark account asked to move it to <strong>{p.newEmail}</strong>. If it was you,
        approve the change; a link to confirm the new address then goes to it:
      </p>
      <p>
        <a href={p.url} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Approve the new address
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        The link expires in 24 hours. If it was not you, ignore this message: the account keeps this address, and you
        may want to change your password.
      </p>
    </EmailLayout>
  );
}

export function emailChangeConfirmationText(p: EmailChangeConfirmationProps): string {
  return [
    `Hello ${p.name},`,
    "",
    `Someone signed in to your Tidemark account asked to move it to ${p.newEmail}. If it was you, approve the change; a link to confirm the new address then goes to it:`,
    p.url,
    "",
    "The link expires in 24 hours. If it was not you, ignore this message: the account keeps this address, and you may want to change your password.",
  ].join("\n");
}

/** To the new address: confirm it, and the account moves to it. */
export interface NewAddressProps {
  name: string;
  url: string;
}

export const newAddressSubject = "Confirm the new address of your Tidemark account";

export function NewAddressEmail(p: NewAddressProps) {
  return (
    <EmailLayout title={newAddressSubject}>
      <p>Hello {p.name},</p>
      <p>Your Tidemark account is moving to this address. Confirm it, and you sign in with it from then on:</p>
      <p>
        <a href={p.url} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Confirm this address
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        The link expires in 24 hours. Until then the account keeps its old address.
      </p>
    </EmailLayout>
  );
}

export function newAddressText(p: NewAddressProps): string {
  return [
    `Hello ${p.name},`,
    "",
    "Your Tidemark account is moving to this address. Confirm it, and you sign in with it from then on:",
    p.url,
    "",
    "The link expires in 24 hours. Until then the account keeps its old address.",
  ].join("\n");
}

/** To an athlete whose coach kept their profile: it is theirs once they choose a password. */
export interface ManagedHandOverProps {
  name: string;
  url: string;
}

export const managedHandOverSubject = "Your coach set up your Tidemark profile: choose a password";

export function ManagedHandOverEmail(p: ManagedHandOverProps) {
  return (
    <EmailLayout title={managedHandOverSubject}>
      <p>Hello {p.name},</p>
      <p>
        Your coach keeps your tests, zones and plan in Tidemark under a profile in your name, and hands it over to you
        at this address. Choose a password, and you sign in with this address from then on:
      </p>
      <p>
        <a href={p.url} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Choose my password
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        The link works for an hour; your coach can send a new one. If you do not know this coach, ignore this message.
      </p>
    </EmailLayout>
  );
}

export function managedHandOverText(p: ManagedHandOverProps): string {
  return [
    `Hello ${p.name},`,
    "",
    "Your coach keeps your tests, zones and plan in Tidemark under a profile in your name, and hands it over to you at this address. Choose a password, and you sign in with this address from then on:",
    p.url,
    "",
    "The link works for an hour; your coach can send a new one. If you do not know this coach, ignore this message.",
  ].join("\n");
}
