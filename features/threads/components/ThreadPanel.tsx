"use client";
import { useState, type FormEvent } from "react";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { useDates } from "@/features/platform/components/dates";
import { FormAlert } from "@/features/platform/components/form-bits";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { MESSAGE_MAX } from "../lib/limits";

interface Message {
  id: string;
  authorName: string;
  authorRole: "athlete" | "coach";
  body: string;
  createdAt: string;
  unread: boolean;
}

/** A message's moment in the reader's own clock: the local calendar day in their date style, then the time (24-hour). */
function moment(instant: string, day: (ymd: string, o?: { year?: boolean }) => string): string {
  const d = new Date(instant);
  const two = (n: number) => String(n).padStart(2, "0");
  return `${day(`${d.getFullYear()}-${two(d.getMonth() + 1)}-${two(d.getDate())}`, { year: false })} ${two(d.getHours())}:${two(d.getMinutes())}`;
}

/**
 * The short conversation on a session or a log between the athlete and their coaches: folded until opened (then loaded,
 * which marks it read), the messages oldest first, and a box to write one.
 */
export function ThreadPanel({
  kind,
  id,
  label = "Messages about this session",
  startOpen = false,
}: {
  kind: "session" | "log";
  id: string;
  label?: string;
  startOpen?: boolean;
}) {
  const dates = useDates();
  const base = `/api/${kind === "session" ? "sessions" : "logs"}/${id}/messages`;
  const [messages, setMessages] = useState<Message[] | null>(null);
  const [error, setError] = useState<string>();
  const [busy, setBusy] = useState(false);
  const [text, setText] = useState("");

  async function load() {
    if (messages) return;
    try {
      setMessages((await apiFetch<{ messages: Message[] }>(base)).messages);
    } catch (e) {
      setError(e instanceof Error ? e.message : "The messages could not be loaded.");
    }
  }

  async function send(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (busy) return;
    if (!text.trim()) return setError("Write a message.");
    setBusy(true);
    setError(undefined);
    try {
      const made = await apiFetch<Message>(base, { method: "POST", body: JSON.stringify({ body: text }) });
      setMessages((m) => [...(m ?? []), made]);
      setText("");
    } catch (err) {
      setError(err instanceof ApiError ? (err.fieldErrors.body?.[0] ?? err.message) : "The message could not be sent.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <details
      className="rounded border border-rule p-2"
      open={startOpen || undefined}
      onToggle={(e) => {
        if ((e.currentTarget as HTMLDetailsElement).open) void load();
      }}
      data-testid="thread"
    >
      <summary className="min-h-6 cursor-pointer py-1 text-sm font-semibold">{label}</summary>
      <div className="mt-2 space-y-2">
        {messages === null && !error ? (
          <p role="status" className="text-sm text-ink-soft">
            Loading the messages…
          </p>
        ) : null}
        {messages && !messages.length ? <p className="text-sm text-ink-soft">No messages yet.</p> : null}
        {messages?.length ? (
          <ol className="space-y-2" aria-label={label}>
            {messages.map((m) => (
              <li
                key={m.id}
                className={`rounded p-2 text-sm ${m.authorRole === "coach" ? "bg-tide-wash" : "bg-ground"}`}
              >
                <p className="text-xs text-ink-soft">
                  <span className="font-semibold text-ink">{m.authorName}</span>
                  {m.authorRole === "coach" ? " (coach)" : ""} ·{" "}
                  <time dateTime={m.createdAt}>{moment(m.createdAt, dates.day)}</time>
                  {m.unread ? <span className="ml-1 font-semibold text-alert">new</span> : null}
                </p>
                <p className="whitespace-pre-wrap">{m.body}</p>
              </li>
            ))}
          </ol>
        ) : null}
        {error ? <FormAlert>{error}</FormAlert> : null}
        <form onSubmit={send} className="space-y-2">
          <label className="block">
            <span className="field-label">Write a message</span>
            <textarea
              className="field-input"
              rows={2}
              maxLength={MESSAGE_MAX}
              value={text}
              onChange={(e) => setText(e.target.value)}
            />
          </label>
          <SubmitButton className="btn-quiet py-1" disabled={busy}>
            {busy ? "Sending…" : "Send"}
          </SubmitButton>
        </form>
      </div>
    </details>
  );
}
