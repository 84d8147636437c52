"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { authErrorMessage, FieldError, FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { authClient } from "../client";
import { forgotPasswordSchema, resetPasswordSchema } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

export function ForgotPasswordForm() {
  const [sent, setSent] = useState(false);
  const [serverError, setServerError] = useState<string>();
  const { register, handleSubmit, formState } = useForm<z.infer<typeof forgotPasswordSchema>>({
    resolver: zodResolver(forgotPasswordSchema),
  });
  const onSubmit = handleSubmit(async ({ email }) => {
    setServerError(undefined);
    const { error } = await authClient.requestPasswordReset({ email, redirectTo: "/reset-password" });
    if (error) return setServerError(authErrorMessage(error));
    setSent(true);
  });
  if (sent) {
    return (
      <FormNotice>
        If an account uses that address, a link to choose a new password is on its way. It expires in one hour.
      </FormNotice>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormAlert>{serverError}</FormAlert>
      <div>
        <label htmlFor="email" className="field-label">
          E-mail
        </label>
        <input
          id="email"
          type="email"
          autoComplete="email"
          className="field-input"
          aria-describedby="email-error"
          {...register("email")}
        />
        <FieldError id="email-error" message={formState.errors.email?.message} />
      </div>
      <SubmitButton className="btn w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Sending…" : "Send me a reset link"}
      </SubmitButton>
    </form>
  );
}

export function ResetPasswordForm({ token }: { token: string }) {
  const [done, setDone] = useState(false);
  const [serverError, setServerError] = useState<string>();
  const { register, handleSubmit, formState } = useForm<z.infer<typeof resetPasswordSchema>>({
    resolver: zodResolver(resetPasswordSchema),
  });
  const onSubmit = handleSubmit(async ({ password }) => {
    setServerError(undefined);
    const { error } = await authClient.resetPassword({ newPassword: password, token });
    if (error) {
      return setServerError(
        error.code === "INVALID_TOKEN"
          ? "This reset link has expired or was already used. Ask for a new one."
          : authErrorMessage(error),
      );
    }
    setDone(true);
  });
  if (done) {
    return (
      <FormNotice>
        Your password is changed.{" "}
        <Link href="/sign-in" className="font-semibold underline">
          Sign in
        </Link>{" "}
        with the new one.
      </FormNotice>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormAlert>{serverError}</FormAlert>
      <div>
        <label htmlFor="password" className="field-label">
          New password <span className="font-normal text-ink-soft">(at least 10 characters)</span>
        </label>
        <input
          id="password"
          type="password"
          autoComplete="new-password"
          className="field-input"
          aria-describedby="password-error"
          {...register("password")}
        />
        <FieldError id="password-error" message={formState.errors.password?.message} />
      </div>
      <div>
        <label htmlFor="confirm" className="field-label">
          Repeat the new password
        </label>
        <input
          id="confirm"
          type="password"
          autoComplete="new-password"
          className="field-input"
          aria-describedby="confirm-error"
          {...register("confirm")}
        />
        <FieldError id="confirm-error" message={formState.errors.confirm?.message} />
      </div>
      <SubmitButton className="btn w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Save the new password"}
      </SubmitButton>
    </form>
  );
}
