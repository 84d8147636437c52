import { EmailLayout } from "./layout";
import { UnsubscribeFooter, unsubscribeText } from "./unsubscribe-footer";

export interface DigestLine {
  athlete: string;
  detail: string;
}

export interface CoachDigestProps {
  name: string;
  squad: string;
  weekLabel: string;
  overBudget: DigestLine[];
  overdueRetests: DigestLine[];
  loadFlags: DigestLine[];
  missed: DigestLine[];
  /** Athletes with messages the coach has not read yet. */
  unread: DigestLine[];
  rosterUrl: string;
  unsubscribeUrl: string;
  settingsUrl: string;
}

export function coachDigestSubject(
  p: Pick<CoachDigestProps, "squad" | "overBudget" | "overdueRetests" | "loadFlags" | "missed"> &
    Partial<Pick<CoachDigestProps, "unread">>,
): string {
  const n =
    p.overBudget.length + p.overdueRetests.length + p.loadFlags.length + p.missed.length + (p.unread?.length ?? 0);
  return n
    ? `${p.squad}: ${n} thing${n === 1 ? "" : "s"} to look at this week`
    : `${p.squad}: a quiet week, nothing flagged`;
}

const SECTIONS = [
  ["overBudget", "Weeks over budget"],
  ["overdueRetests", "Retests overdue"],
  ["loadFlags", "Acute:chronic ratio outside 0.8–1.3"],
  ["missed", "Sessions missed last week"],
  ["unread", "Messages you have not read"],
] as const;

export function CoachDigestEmail(p: CoachDigestProps) {
  return (
    <EmailLayout
      title={coachDigestSubject(p)}
      footer={<UnsubscribeFooter what="the weekly coach digest" url={p.unsubscribeUrl} settingsUrl={p.settingsUrl} />}
    >
      <p>Hello {p.name},</p>
      <p>
        What needs a look in <strong>{p.squad}</strong>, week of {p.weekLabel}:
      </p>
      {SECTIONS.map(([key, title]) => (
        <div key={key}>
          <p style={{ fontWeight: 700, marginBottom: 4 }}>
            {title} ({p[key].length})
          </p>
          {p[key].length ? (
            <ul style={{ marginTop: 0, paddingLeft: 20 }}>
              {p[key].map((l, i) => (
                <li key={i}>
                  <strong>{l.athlete}</strong>: {l.detail}
                </li>
              ))}
            </ul>
          ) : (
            <p style={{ marginTop: 0, color: "#5b6770" }}>None.</p>
          )}
        </div>
      ))}
      <p>
        <a href={p.rosterUrl} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Open the roster
        </a>
      </p>
    </EmailLayout>
  );
}

export function coachDigestText(p: CoachDigestProps): string {
  return [
    `Hello ${p.name},`,
    "",
    `What needs a look in ${p.squad}, week of ${p.weekLabel}:`,
    ...SECTIONS.flatMap(([key, title]) => [
      "",
      `${title} (${p[key].length}):`,
      ...(p[key].length ? p[key].map((l) => `- ${l.athlete}: ${l.detail}`) : ["None."]),
    ]),
    "",
    `Open the roster: ${p.rosterUrl}`,
    "",
    unsubscribeText("the weekly coach digest", p.unsubscribeUrl, p.settingsUrl),
  ].join("\n");
}
