"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { ApiError, apiFetch } from "@/features/platform/lib/api-client";
import { FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { SPORT_LABELS, SPORTS } from "@/features/platform/lib/sports";

const message = (e: unknown, field: string) =>
  e instanceof ApiError ? (e.fieldErrors[field]?.[0] ?? e.message) : "That did not work; try again.";

/** A coach adds an athlete who has no e-mail address yet, so that a test can be recorded on the spot. */
export function AddManagedAthlete({ squadId }: { squadId: string }) {
  const router = useRouter();
  const [error, setError] = useState<string>();
  const [made, setMade] = useState<{ id: string; name: string }>();
  const [busy, setBusy] = useState(false);
  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    setBusy(true);
    setError(undefined);
    setMade(undefined);
    try {
      const r = await apiFetch<{ id: string; name: string }>(`/api/squads/${squadId}/athletes`, {
        method: "POST",
        body: JSON.stringify({ name: String(f.get("name") ?? ""), sports: [String(f.get("sport") ?? "")] }),
      });
      setMade(r);
      form.reset();
      router.refresh();
    } catch (err) {
      setError(message(err, "name"));
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={submit} className="card space-y-3" aria-labelledby="add-managed-h">
      <h2 id="add-managed-h" className="text-lg font-bold">
        Add an athlete who has no address yet
      </h2>
      <p className="text-sm text-ink-soft">
        For a test on the spot: the profile is kept by the squad&apos;s coaches, cannot sign in and gets no e-mail. Hand
        it over to the athlete&apos;s address from their page when they have one.
      </p>
      {error ? <FormAlert>{error}</FormAlert> : null}
      {made ? (
        <FormNotice>
          Added {made.name}.{" "}
          <Link href={`/athletes/${made.id}`} className="font-semibold underline">
            Open their page
          </Link>{" "}
          to answer the readiness questions with them and record a test.
        </FormNotice>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="block">
          <span className="field-label">Name</span>
          <input name="name" required minLength={2} maxLength={80} className="field-input" autoComplete="off" />
        </label>
        <label className="block">
          <span className="field-label">Sport</span>
          <select name="sport" className="field-input" defaultValue="running">
            {SPORTS.map((s) => (
              <option key={s} value={s}>
                {SPORT_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
      </div>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Adding…" : "Add the athlete"}
      </SubmitButton>
    </form>
  );
}

/** On a managed profile's page: hand it over to the athlete's own address (a link to choose a password goes there). */
export function HandOverManagedAthlete({ athleteId, name }: { athleteId: string; name: string }) {
  const [error, setError] = useState<string>();
  const [sentTo, setSentTo] = useState<string>();
  const [busy, setBusy] = useState(false);
  async function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    setBusy(true);
    setError(undefined);
    setSentTo(undefined);
    try {
      const r = await apiFetch<{ email: string }>(`/api/athletes/${athleteId}/hand-over`, {
        method: "POST",
        body: JSON.stringify({ email: String(f.get("email") ?? "") }),
      });
      setSentTo(r.email);
    } catch (err) {
      setError(message(err, "email"));
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={submit} className="card space-y-3" aria-labelledby="hand-over-h">
      <h2 id="hand-over-h" className="text-lg font-bold">
        Hand this profile over to the athlete
      </h2>
      <p className="text-sm text-ink-soft">
        This profile is kept by the squad&apos;s coaches. When {name} has an address, send the profile there: a link to
        choose a password arrives, and the profile, with its tests and plan, becomes their own account.
      </p>
      {error ? <FormAlert>{error}</FormAlert> : null}
      {sentTo ? (
        <FormNotice>
          Sent to {sentTo}. The link works for an hour; send it again if it runs out before {name} opens it.
        </FormNotice>
      ) : null}
      <label className="block max-w-sm">
        <span className="field-label">{name}&apos;s e-mail address</span>
        <input name="email" type="email" required className="field-input" autoComplete="off" />
      </label>
      <SubmitButton className="btn" disabled={busy}>
        {busy ? "Sending…" : "Send the profile to this address"}
      </SubmitButton>
    </form>
  );
}
