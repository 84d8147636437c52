import { EmailLayout } from "./layout";
import { sentence } from "./text";
import { UnsubscribeFooter, unsubscribeText } from "./unsubscribe-footer";

export interface RetestReminderProps {
  name: string;
  /** "in 7 days", "tomorrow" or "overdue". */
  stage: "week" | "day" | "overdue";
  date: string;
  dateLabel: string;
  protocol: string;
  questions: string[];
  screeningUrl: string;
  unsubscribeUrl: string;
  settingsUrl: string;
}

export function retestReminderSubject(p: Pick<RetestReminderProps, "stage" | "dateLabel">): string {
  if (p.stage === "overdue") return `Your retest of ${p.dateLabel} is still to do`;
  return p.stage === "day" ? `Retest tomorrow, ${p.dateLabel}` : `Retest in a week: ${p.dateLabel}`;
}

const PREPARE = [
  "Keep the two days before easy: no hard sessions.",
  "Sleep normally, eat as on a usual training day and drink enough; no big meal in the last two to three hours.",
  "Bring the same shoes or bike set-up as last time, and your heart-rate strap.",
  "Do not test when you are ill, injured or feel unwell; move the date with your coach instead.",
];

export function RetestReminderEmail(p: RetestReminderProps) {
  return (
    <EmailLayout
      title={retestReminderSubject(p)}
      footer={<UnsubscribeFooter what="retest reminders" url={p.unsubscribeUrl} settingsUrl={p.settingsUrl} />}
    >
      <p>Hello {p.name},</p>
      {p.stage === "overdue" ? (
        <p>
          Your retest was planned for <strong>{p.dateLabel}</strong> and no new test is recorded yet. Your zones follow
          your fitness only when they are tested; agree a new date with your coach.
        </p>
      ) : (
        <p>
          Your retest is on <strong>{p.dateLabel}</strong> ({p.stage === "day" ? "tomorrow" : "in seven days"}):{" "}
          {sentence(p.protocol)}
        </p>
      )}
      <p style={{ fontWeight: 700, marginBottom: 4 }}>How to prepare</p>
      <ul style={{ marginTop: 0, paddingLeft: 20 }}>
        {PREPARE.map((x) => (
          <li key={x}>{x}</li>
        ))}
      </ul>
      <p style={{ fontWeight: 700, marginBottom: 4 }}>Before the test, answer the readiness questions</p>
      <ol style={{ marginTop: 0, paddingLeft: 20 }}>
        {p.questions.map((q) => (
          <li key={q}>{q}</li>
        ))}
      </ol>
      <p>
        <a href={p.screeningUrl} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Answer them in Tidemark
        </a>
      </p>
      <p style={{ fontSize: 13, color: "#5b6770" }}>
        A yes to any question means: talk to a doctor or another licensed health professional before a hard test.
        Tidemark is not a medical device.
      </p>
    </EmailLayout>
  );
}

export function retestReminderText(p: RetestReminderProps): string {
  return [
    `Hello ${p.name},`,
    "",
    p.stage === "overdue"
      ? `Your retest was planned for ${p.dateLabel} and no new test is recorded yet. Your zones follow your fitness only when they are tested; agree a new date with your coach.`
      : `Your retest is on ${p.dateLabel} (${p.stage === "day" ? "tomorrow" : "in seven days"}): ${sentence(p.protocol)}`,
    "",
    "How to prepare:",
    ...PREPARE.map((x) => `- ${x}`),
    "",
    "Before the test, answer the readiness questions:",
    ...p.questions.map((q, i) => `${i + 1}. ${q}`),
    `Answer them in Tidemark: ${p.screeningUrl}`,
    "",
    "A yes to any question means: talk to a doctor or another licensed health professional before a hard test. Tidemark is not a medical device.",
    "",
    unsubscribeText("retest reminders", p.unsubscribeUrl, p.settingsUrl),
  ].join("\n");
}
