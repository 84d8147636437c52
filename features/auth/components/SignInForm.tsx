"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { authErrorMessage, FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { authClient } from "../client";
import { signInSchema } from "../schemas";
import { safeNext } from "../lib/safe-next";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

type Values = z.infer<typeof signInSchema>;

export function SignInForm({ next }: { next?: string }) {
  const router = useRouter();
  const [serverError, setServerError] = useState<string>();
  const { register, handleSubmit, formState } = useForm<Values>({ resolver: zodResolver(signInSchema) });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setServerError(undefined);
    const target = safeNext(next, window.location.origin);
    const { error } = await authClient.signIn.email({
      email: values.email,
      password: values.password,
      callbackURL: target,
    });
    if (error) {
      if (error.code === "EMAIL_NOT_VERIFIED") {
        return setServerError(
          `Confirm your address first: we have sent a new link to ${values.email}. Open it and you are signed in.`,
        );
      }
      return setServerError(authErrorMessage(error));
    }
    router.push(target);
    router.refresh();
  });

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
          aria-invalid={!!errors.email}
          aria-describedby="email-error"
          {...register("email")}
        />
        <FieldError id="email-error" message={errors.email?.message} />
      </div>
      <div>
        <label htmlFor="password" className="field-label">
          Password
        </label>
        <input
          id="password"
          type="password"
          autoComplete="current-password"
          className="field-input"
          aria-invalid={!!errors.password}
          aria-describedby="password-error"
          {...register("password")}
        />
        <FieldError id="password-error" message={errors.password?.message} />
      </div>
      <SubmitButton className="btn w-full" disabled={isSubmitting}>
        {isSubmitting ? "Signing in…" : "Sign in"}
      </SubmitButton>
      <p className="text-sm text-ink-soft">
        <Link href="/forgot-password" className="font-semibold text-tide hover:underline">
          Forgot your password?
        </Link>
      </p>
    </form>
  );
}
