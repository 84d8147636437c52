import { EmailLayout } from "./layout";
import { UnsubscribeFooter, unsubscribeText } from "./unsubscribe-footer";

export interface ThreadMessageProps {
  /** The recipient's name. */
  name: string;
  authorName: string;
  /** What the thread is on: "Tempo run on Tuesday 5 January 2027" or "your log of Easy spin, 3 January 2027". */
  subjectLine: string;
  body: string;
  url: string;
  unsubscribeUrl: string;
  settingsUrl: string;
}

export const THREAD_MESSAGES_WHAT = "e-mails about new messages";

export function threadMessageSubject(p: Pick<ThreadMessageProps, "authorName" | "subjectLine">): string {
  return `${p.authorName} wrote about ${p.subjectLine}`;
}

export function ThreadMessageEmail(p: ThreadMessageProps) {
  return (
    <EmailLayout
      title={threadMessageSubject(p)}
      footer={<UnsubscribeFooter what={THREAD_MESSAGES_WHAT} url={p.unsubscribeUrl} settingsUrl={p.settingsUrl} />}
    >
      <p>Hello {p.name},</p>
      <p>
        {p.authorName} wrote about <strong>{p.subjectLine}</strong>:
      </p>
      <blockquote
        style={{ margin: "0 0 16px", padding: "8px 12px", borderLeft: "3px solid #0f5e63", whiteSpace: "pre-wrap" }}
      >
        {p.body}
      </blockquote>
      <p>
        <a href={p.url} style={{ color: "#0f5e63", fontWeight: 700 }}>
          Read and answer in Tidemark
        </a>
      </p>
    </EmailLayout>
  );
}

export function threadMessageText(p: ThreadMessageProps): string {
  return [
    `Hello ${p.name},`,
    "",
    `${p.authorName} wrote about ${p.subjectLine}:`,
    "",
    ...p.body.split("\n").map((l) => `> ${l}`),
    "",
    `Read and answer in Tidemark: ${p.url}`,
    "",
    unsubscribeText(THREAD_MESSAGES_WHAT, p.unsubscribeUrl, p.settingsUrl),
  ].join("\n");
}
