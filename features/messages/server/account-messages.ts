import "server-only";
import { createElement } from "react";
import { getDb, type Database } from "@/db/client";
import { InvitationEmail, invitationSubject, invitationText, type InvitationEmailProps } from "@/emails/invitation";
import { EmailVerificationEmail, emailVerificationSubject, emailVerificationText, ExistingAccountEmail, existingAccountSubject, existingAccountText } from "@/emails/email-verification";
import { PasswordResetEmail, passwordResetSubject, passwordResetText } from "@/emails/password-reset";
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
