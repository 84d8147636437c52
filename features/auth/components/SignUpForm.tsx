"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { authErrorMessage, FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { authClient } from "../client";
import { signUpSchema } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

type Values = z.infer<typeof signUpSchema>;

/**
 * Creates an account. With `fixedEmail` (an invitation), the address is the invited one and cannot be changed. The account
 * works once its address is confirmed: the form then says where the link went, and the link signs in and comes back to
 * `callbackURL`.
 */
export function SignUpForm({ fixedEmail, callbackURL = "/home" }: { fixedEmail?: string; callbackURL?: string }) {
  const [serverError, setServerError] = useState<string>();
  const [sentTo, setSentTo] = useState<string>();
  const { register, handleSubmit, formState } = useForm<Values>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { email: fixedEmail ?? "" },
  });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setServerError(undefined);
    const { error } = await authClient.signUp.email({
      name: values.name,
      email: values.email,
      password: values.password,
      callbackURL,
    });
    if (error) return setServerError(authErrorMessage(error));
    setSentTo(values.email);
  });

  if (sentTo) return <CheckInbox email={sentTo} callbackURL={callbackURL} />;

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormAlert>{serverError}</FormAlert>
      <div>
        <label htmlFor="name" className="field-label">
          Your name
        </label>
        <input
          id="name"
          autoComplete="name"
          className="field-input"
          aria-invalid={!!errors.name}
          aria-describedby="name-error"
          {...register("name")}
        />
        <FieldError id="name-error" message={errors.name?.message} />
      </div>
      <div>
        <label htmlFor="email" className="field-label">
          E-mail
        </label>
        <input
          id="email"
          type="email"
          autoComplete="email"
          readOnly={!!fixedEmail}
          className="field-input read-only:bg-ground"
          aria-invalid={!!errors.email}
          aria-describedby="email-error"
          {...register("email")}
        />
        <FieldError id="email-error" message={errors.email?.message} />
      </div>
      <div>
        <label htmlFor="password" className="field-label">
          Password <span className="font-normal text-ink-soft">(at least 10 characters)</span>
        </label>
        <input
          id="password"
          type="password"
          autoComplete="new-password"
          className="field-input"
          aria-invalid={!!errors.password}
          aria-describedby="password-error"
          {...register("password")}
        />
        <FieldError id="password-error" message={errors.password?.message} />
      </div>
      <SubmitButton className="btn w-full" disabled={isSubmitting}>
        {isSubmitting ? "Creating your account…" : "Create account"}
      </SubmitButton>
    </form>
  );
}

/** After sign-up: where the confirmation link went, and a way to send it again. */
export function CheckInbox({ email, callbackURL }: { email: string; callbackURL: string }) {
  const [state, setState] = useState<"idle" | "sending" | "sent" | "failed">("idle");
  return (
    <div className="space-y-3" role="status">
      <h2 className="text-lg font-bold">Check your inbox</h2>
      <p>
        We sent a link to <strong>{email}</strong>. Open it to confirm that the address is yours: you are then signed in
        and can carry on. The link works for 24 hours.
      </p>
      <p className="text-sm text-ink-soft">
        Nothing arrived after a few minutes? Look in the spam folder, or{" "}
        <button
          type="button"
          className="font-semibold text-tide underline"
          disabled={state === "sending"}
          onClick={async () => {
            setState("sending");
            const { error } = await authClient.sendVerificationEmail({ email, callbackURL });
            setState(error ? "failed" : "sent");
          }}
        >
          send the link again
        </button>
        .
      </p>
      {state === "sent" ? <p className="text-sm">A new link is on its way.</p> : null}
      {state === "failed" ? (
        <p className="text-sm text-alert">The link could not be sent just now. Wait a minute, then try again.</p>
      ) : null}
    </div>
  );
}
