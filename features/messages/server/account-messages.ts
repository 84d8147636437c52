import "server-only";
import { createElement } from "react";
import { getDb, type Database } from "@/db/client";
import { InvitationEmail, invitationSubject, invitationText, type InvitationEmailProps } from "@/emails/invitation";
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
