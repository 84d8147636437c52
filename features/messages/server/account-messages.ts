import "server-only";
import { createElement } from "react";
import { getDb, type Database } from "@/db/client";
import { InvitationEmail, invitationSubject, invitationText, type InvitationEmailProps } from "@/emails/invitation";
import {
  EmailVerificationEmail,
  emailVerificationSubject,
  emailVerificationText,
  ExistingAccountEmail,
  existingAccountSubject,
  existingAccountText,
  SignInPausedEmail,
} from "@/emails/email-verification";
import { PasswordResetEmail, passwordResetSubject, passwordResetText } from "@/emails/password-reset";
import {
  EmailChangeConfirmationEmail,
  ManagedHandOverEmail,
  managedHandOverSubject,
  managedHandOverText,
  emailChangeConfirmationSubject,
  emailChangeConfirmationText,
  NewAddressEmail,
  newAddressSubject,
  newAddressText,
} from "@/emails/email-change";
import { renderEmailHtml } from "@/emails/render";
import { queueMessage } from "./outbox";

export async function sendPasswordReset(p: { to: string; name: string; url: string }): Promise<void> {
  await queueMessage(getDb(), {
    kind: "password_reset",
    to: p.to,
    subject: passwordResetSubject,
    text: passwordResetText(p),
    html: await renderEmailHtml(createElement(PasswordResetEmail, p)),
    meta: { url: p.url },
  });
}

export async function sendEmailVerification(p: { to: string; name: string; url: string }): Promise<void> {
  await queueMessage(getDb(), {
    kind: "email_verification",
    to: p.to,
    subject: emailVerificationSubject,
    text: emailVerificationText(p),
    html: await renderEmailHtml(createElement(EmailVerificationEmail, p)),
    meta: { url: p.url },
  });
}

/** Someone tried to open an account with an address that has one: its owner hears of it (the sign-up page says nothing). */
export async function sendExistingAccountNotice(p: { to: string; name: string }): Promise<void> {
  await queueMessage(getDb(), {
    kind: "existing_account",
    to: p.to,
    subject: existingAccountSubject,
    text: existingAccountText(p),
    html: await renderEmailHtml(createElement(ExistingAccountEmail, p)),
  });
}

/** Sign-in to this account was paused after several wrong passwords: its owner hears of it at once. */
export async function sendSignInPausedNotice(p: {
  to: string;
  name: string;
  failures: number;
  minutes: number;
}): Promise<void> {
  const text = [
    `Hello ${p.name},`,
    "",
    `Someone typed a wrong password for your Tidemark account ${p.failures} times in a row, so sign-in to it is paused for ${p.minutes} minutes.`,
    'If it was you, wait and try again, or choose a new password with "Forgot your password?" on the sign-in page.',
    "If it was not you, your account is safe as long as nobody knows the password; choosing a new one is a good idea.",
  ].join("\n");
  await queueMessage(getDb(), {
    kind: "sign_in_paused",
    to: p.to,
    subject: "Sign-in to your Tidemark account is paused",
    text,
    html: await renderEmailHtml(createElement(SignInPausedEmail, p)),
  });
}

export async function sendInvitation(
  tx: Pick<Database, "insert">,
  p: InvitationEmailProps & { to: string; invitationId: string },
): Promise<void> {
  await queueMessage(tx, {
    kind: "invitation",
    to: p.to,
    subject: invitationSubject(p),
    text: invitationText(p),
    html: await renderEmailHtml(createElement(InvitationEmail, p)),
    meta: { url: p.url, invitationId: p.invitationId },
  });
}

/** A change of address asked for while signed in: the current address approves it first. */
export async function sendEmailChangeConfirmation(p: {
  to: string;
  name: string;
  newEmail: string;
  url: string;
}): Promise<void> {
  await queueMessage(getDb(), {
    kind: "email_change_confirmation",
    to: p.to,
    subject: emailChangeConfirmationSubject,
    text: emailChangeConfirmationText(p),
    html: await renderEmailHtml(createElement(EmailChangeConfirmationEmail, p)),
    meta: { url: p.url, newEmail: p.newEmail },
  });
}

/** Then the new address confirms itself, and the account moves to it. */
export async function sendNewAddressVerification(p: { to: string; name: string; url: string }): Promise<void> {
  await queueMessage(getDb(), {
    kind: "email_change_verification",
    to: p.to,
    subject: newAddressSubject,
    text: newAddressText(p),
    html: await renderEmailHtml(createElement(NewAddressEmail, p)),
    meta: { url: p.url },
  });
}

/** A managed profile handed over to the athlete's address: the link chooses its first password. */
export async function sendManagedHandOver(p: { to: string; name: string; url: string }): Promise<void> {
  await queueMessage(getDb(), {
    kind: "managed_hand_over",
    to: p.to,
    subject: managedHandOverSubject,
    text: managedHandOverText(p),
    html: await renderEmailHtml(createElement(ManagedHandOverEmail, p)),
    meta: { url: p.url },
  });
}
