"use client";
import { useMemo, useState } from "react";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { apiFetch } from "@/features/platform/lib/api-client";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { useSave } from "@/features/platform/components/use-save";

/** The coach's digest setting and time zone. */
export function CoachDigestSettings({ initial }: { initial: { timeZone: string; coachDigest: boolean } }) {
  const timeZones = useMemo(() => Intl.supportedValuesOf("timeZone"), []);
  const [timeZone, setTimeZone] = useState(initial.timeZone);
  const [coachDigest, setCoachDigest] = useState(initial.coachDigest);
  const { state, busy, save } = useSave();
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        void save(async () => {
          await apiFetch("/api/me/notifications", { method: "PATCH", body: JSON.stringify({ timeZone, coachDigest }) });
          return coachDigest
            ? `Saved. The digest comes on Mondays at 07:00, ${timeZone} time.`
            : "Saved. No weekly digest will be sent.";
        });
      }}
    >
      {state ? state.kind === "ok" ? <FormNotice>{state.text}</FormNotice> : <FormAlert>{state.text}</FormAlert> : null}
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={coachDigest} onChange={(e) => setCoachDigest(e.target.checked)} />
        Weekly coach digest on Mondays at 07:00: weeks over budget, overdue retests, load flags and missed sessions
      </label>
      <label className="block max-w-sm">
        <span className="field-label">Your time zone</span>
        <select className="field-input" value={timeZone} onChange={(e) => setTimeZone(e.target.value)}>
          {timeZones.includes(timeZone) ? null : <option value={timeZone}>{timeZone}</option>}
          {timeZones.map((tz) => (
            <option key={tz} value={tz}>
              {tz}
            </option>
          ))}
        </select>
      </label>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Saving…" : "Save e-mail settings"}
      </SubmitButton>
    </form>
  );
}

/** The private calendar feed: its address, renew (the old one stops working) and switch off. */
export function CalendarFeedSettings({ initialUrl }: { initialUrl: string | null }) {
  const [url, setUrl] = useState(initialUrl);
  const [state, setState] = useState<{ kind: "ok" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const act = async (method: "POST" | "DELETE") => {
    setBusy(true);
    setState(null);
    try {
      if (method === "POST") {
        const r = await apiFetch<{ url: string }>("/api/me/calendar-feed", { method });
        setUrl(r.url);
        setState({
          kind: "ok",
          text: url
            ? "A new address is ready; the old one no longer works."
            : "Your feed is on. Add the address to your calendar app.",
        });
      } else {
        await apiFetch("/api/me/calendar-feed", { method });
        setUrl(null);
        setState({ kind: "ok", text: "The feed is off; its address no longer works." });
      }
    } catch (err) {
      setState({ kind: "error", text: err instanceof Error ? err.message : "That did not work." });
    } finally {
      setBusy(false);
    }
  };
  return (
    <div className="space-y-3">
      {state ? state.kind === "ok" ? <FormNotice>{state.text}</FormNotice> : <FormAlert>{state.text}</FormAlert> : null}
      <p className="text-sm text-ink-soft">
        Subscribe to your plan from a calendar app (iCalendar). Anyone with the address can read your plan: keep it to
        yourself, and renew it if it leaked.
      </p>
      {url ? (
        <label className="block">
          <span className="field-label">Your private feed address</span>
          <input
            className="field-input font-mono text-xs"
            readOnly
            value={url}
            onFocus={(e) => e.currentTarget.select()}
          />
        </label>
      ) : (
        <p className="text-sm">The feed is off.</p>
      )}
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn" disabled={busy} onClick={() => void act("POST")}>
          {url ? "Renew the address" : "Switch the feed on"}
        </button>
        {url ? (
          <button type="button" className="btn-quiet" disabled={busy} onClick={() => void act("DELETE")}>
            Switch the feed off
          </button>
        ) : null}
      </div>
    </div>
  );
}

/** E-mails about new messages on the person's session and log conversations. */
export function MessageEmailSettings({ initial }: { initial: boolean }) {
  const [on, setOn] = useState(initial);
  const { state, busy, save } = useSave();
  return (
    <form
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        void save(async () => {
          await apiFetch("/api/me/notifications", { method: "PATCH", body: JSON.stringify({ messageEmails: on }) });
          return on
            ? "Saved. A new message on one of your conversations comes by e-mail."
            : "Saved. New messages wait in Tidemark; no e-mail is sent.";
        });
      }}
    >
      {state ? state.kind === "ok" ? <FormNotice>{state.text}</FormNotice> : <FormAlert>{state.text}</FormAlert> : null}
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={on} onChange={(e) => setOn(e.target.checked)} />
        E-mail me when someone writes about one of my sessions or logs
      </label>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Saving…" : "Save message e-mails"}
      </SubmitButton>
    </form>
  );
}
