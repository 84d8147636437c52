import { EmailLayout } from "./layout";
import { sentence } from "./text";
import { UnsubscribeFooter, unsubscribeText } from "./unsubscribe-footer";
import { titleWithLength } from "@/features/planning/lib/title";

export interface ReminderStep {
  label: string;
  target: string;
}

export interface ReminderSession {
  title: string;
  minutes: number;
  notes: string;
  steps: ReminderStep[];
  /** Where the targets' numbers come from when not from the session's own sport (or that there are none yet). */
  zonesNote?: string | null;
}

/** "Long run 90 min" is not followed by "· 90 min" again; another title gets its length. */
export function sessionHeading(s: Pick<ReminderSession, "title" | "minutes">): string {
  return titleWithLength(s.title, s.minutes);
}

export interface SessionReminderProps {
  name: string;
  /** The day of the sessions, written out ("Tuesday 5 January 2027"). */
  dayLabel: string;
  when: "today" | "tomorrow";
  sessions: ReminderSession[];
  todayUrl: string;
  unsubscribeUrl: string;
  settingsUrl: string;
}

export function sessionReminderSubject(p: Pick<SessionReminderProps, "sessions" | "when">): string {
  const first = p.sessions[0]?.title ?? "Training";
  return p.sessions.length > 1
    ? `${p.when === "today" ? "Today" : "Tomorrow"}: ${first} and ${p.sessions.length - 1} more`
    : `${p.when === "today" ? "Today" : "Tomorrow"}: ${first}`;
}

export function SessionReminderEmail(p: SessionReminderProps) {
  return (
    <EmailLayout
      title={sessionReminderSubject(p)}
      footer={<UnsubscribeFooter what="session reminders" url={p.unsubscribeUrl} settingsUrl={p.settingsUrl} />}
    >
      <p>Hello {p.name},</p>
      <p>
        Your plan for {p.when}, {p.dayLabel}:
      </p>
      {p.sessions.map((s, i) => (
        <div key={i} style={{ margin: "12px 0" }}>
          <p style={{ margin: 0, fontWeight: 700 }}>{sessionHeading(s)}</p>
          {s.notes ? <p style={{ margin: "4px 0", color: "#5b6770" }}>{sentence(s.notes)}</p> : null}
          {s.zonesNote ? <p style={{ margin: "4px 0", color: "#5b6770" }}>{s.zonesNote}</p> : null}
          <ul style={{ margin: "4px 0", paddingLeft: 20 }}>
            {s.steps.map((st, j) => (
              <li key={j}>
                {st.label}: {st.target}
              </li>
            ))}
          </ul>
        </div>
      ))}
      <p>
        <a href={p.todayUrl} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Open today in Tidemark
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        Feeling unwell or unusually tired? An easy day or rest is the better choice; tell your coach.
      </p>
    </EmailLayout>
  );
}

export function sessionReminderText(p: SessionReminderProps): string {
  return [
    `Hello ${p.name},`,
    "",
    `Your plan for ${p.when}, ${p.dayLabel}:`,
    ...p.sessions.flatMap((s) => [
      "",
      sessionHeading(s),
      ...(s.notes ? [sentence(s.notes)] : []),
      ...(s.zonesNote ? [s.zonesNote] : []),
      ...s.steps.map((st) => `- ${st.label}: ${st.target}`),
    ]),
    "",
    `Open today in Tidemark: ${p.todayUrl}`,
    "",
    "Feeling unwell or unusually tired? An easy day or rest is the better choice; tell your coach.",
    "",
    unsubscribeText("session reminders", p.unsubscribeUrl, p.settingsUrl),
  ].join("\n");
}
