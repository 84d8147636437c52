"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { Day } from "@/features/platform/components/dates";
import { useForm } from "react-hook-form";
import { FieldError, FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { useInvitations, useInvite, useWithdrawInvitation } from "../api";
import { ApiError } from "@/features/platform/lib/api-client";
import { inviteSchema, ROLE_LABELS, type InviteInput } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

/** `fakeInbox`: on a local installation, the e-mail fake's own inbox, where the invitation can be read. */
export function InvitePanel({ squadId, fakeInbox }: { squadId: string; fakeInbox: string | null }) {
  const invite = useInvite(squadId);
  const invitations = useInvitations(squadId, true);
  const withdraw = useWithdrawInvitation(squadId);
  const [sentTo, setSentTo] = useState<string>();
  const { register, handleSubmit, formState, reset, setError } = useForm<InviteInput>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { email: "", role: "athlete" },
  });
  const onSubmit = handleSubmit(async (values) => {
    setSentTo(undefined);
    try {
      await invite.mutateAsync(values);
      setSentTo(values.email);
      reset({ email: "", role: values.role });
    } catch (e) {
      if (e instanceof ApiError && e.fieldErrors.email) setError("email", { message: e.fieldErrors.email[0] });
      else setError("root", { message: e instanceof Error ? e.message : "The invitation could not be sent." });
    }
  });
  return (
    <section aria-labelledby="invite-heading" className="card space-y-4">
      <h2 id="invite-heading" className="text-lg font-bold">
        Invite to the squad
      </h2>
      <form onSubmit={onSubmit} noValidate className="space-y-3">
        <FormAlert>{formState.errors.root?.message}</FormAlert>
        {sentTo ? (
          <FormNotice>
            Invitation sent to {sentTo}.
            {fakeInbox ? (
              <>
                {" "}
                On this local installation it arrives in the{" "}
                <a className="underline" href={fakeInbox}>
                  e-mail fake&apos;s inbox
                </a>
                .
              </>
            ) : null}
          </FormNotice>
        ) : null}
        <div>
          <label htmlFor="invite-email" className="field-label">
            E-mail
          </label>
          <input
            id="invite-email"
            type="email"
            className="field-input"
            aria-describedby="invite-email-error"
            {...register("email")}
          />
          <FieldError id="invite-email-error" message={formState.errors.email?.message} />
        </div>
        <div>
          <label htmlFor="invite-role" className="field-label">
            Role
          </label>
          <select id="invite-role" className="field-input" {...register("role")}>
            <option value="athlete">Athlete</option>
            <option value="coach">Coach</option>
          </select>
        </div>
        <SubmitButton className="btn" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? "Sending…" : "Send invitation"}
        </SubmitButton>
      </form>
      <div>
        <h3 className="text-sm font-semibold">Open invitations</h3>
        {withdraw.isError ? (
          <p role="alert" className="text-sm text-alert">
            The invitation could not be withdrawn: {withdraw.error.message}
          </p>
        ) : null}
        {invitations.isPending ? (
          <p role="status" className="text-sm text-ink-soft">
            Loading…
          </p>
        ) : invitations.isError ? (
          <p role="alert" className="text-sm text-alert">
            Could not load the invitations: {invitations.error.message}
          </p>
        ) : invitations.data.length === 0 ? (
          <p className="text-sm text-ink-soft">None waiting.</p>
        ) : (
          <ul className="mt-1 space-y-1 text-sm">
            {invitations.data.map((i) => (
              <li key={i.id} className="flex flex-wrap items-center gap-x-2">
                <span>
                  {i.email} · {ROLE_LABELS[i.role]} · expires <Day value={i.expiresAt.slice(0, 10)} />
                </span>
                <button
                  type="button"
                  className="font-semibold text-tide underline disabled:opacity-60"
                  disabled={withdraw.isPending && withdraw.variables === i.id}
                  aria-label={`Withdraw the invitation to ${i.email}`}
                  onClick={() => withdraw.mutate(i.id)}
                >
                  Withdraw
                </button>
              </li>
            ))}
          </ul>
        )}
      </div>
    </section>
  );
}
