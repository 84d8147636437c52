import { EmailLayout } from "./layout";

export interface InvitationEmailProps {
  inviterName: string;
  squadName: string;
  roleLabel: string;
  url: string;
  expiresOn: string;
}

export function invitationSubject(p: InvitationEmailProps): string {
  return `${p.inviterName} invited you to ${p.squadName} on Tidemark`;
}

export function InvitationEmail(p: InvitationEmailProps) {
  return (
    <EmailLayout title={invitationSubject(p)}>
      <p>
        {p.inviterName} invited you to join <strong>{p.squadName}</strong> on Tidemark as {p.roleLabel}.
      </p>
      <p>
        <a href={p.url} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Accept the invitation
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>The link works once and expires on {p.expiresOn}.</p>
    </EmailLayout>
  );
}

export function invitationText(p: InvitationEmailProps): string {
  return [
    `${p.inviterName} invited you to join ${p.squadName} on Tidemark as ${p.roleLabel}.`,
    "",
    `Accept the invitation: ${p.url}`,
    "",
    `The link works once and expires on ${p.expiresOn}.`,
  ].join("\n");
}
