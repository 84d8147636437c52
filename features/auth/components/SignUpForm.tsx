"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { authErrorMessage, FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { authClient } from "../client";
import { signUpSchema } from "../schemas";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

type Values = z.infer<typeof signUpSchema>;

/** Creates an account. With `fixedEmail` (an invitation), the address is the invited one and cannot be changed. */
export function SignUpForm({ fixedEmail, after }: { fixedEmail?: string; after?: () => Promise<void> | void }) {
  const router = useRouter();
  const [serverError, setServerError] = useState<string>();
  const { register, handleSubmit, formState } = useForm<Values>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { email: fixedEmail ?? "" },
  });
  const { errors, isSubmitting } = formState;

  const onSubmit = handleSubmit(async (values) => {
    setServerError(undefined);
    const { error } = await authClient.signUp.email({ name: values.name, email: values.email, password: values.password });
    if (error) return setServerError(authErrorMessage(error));
    if (after) return after();
    router.push("/home");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormAlert>{serverError}</FormAlert>
      <div>
        <label htmlFor="name" className="field-label">Your name</label>
        <input id="name" autoComplete="name" className="field-input" aria-invalid={!!errors.name} aria-describedby="name-error" {...register("name")} />
        <FieldError id="name-error" message={errors.name?.message} />
      </div>
      <div>
        <label htmlFor="email" className="field-label">E-mail</label>
        <input id="email" type="email" autoComplete="email" readOnly={!!fixedEmail} className="field-input read-only:bg-ground" aria-invalid={!!errors.email} aria-describedby="email-error" {...register("email")} />
        <FieldError id="email-error" message={errors.email?.message} />
      </div>
      <div>
        <label htmlFor="password" className="field-label">Password <span className="font-normal text-ink-soft">(at least 10 characters)</span></label>
        <input id="password" type="password" autoComplete="new-password" className="field-input" aria-invalid={!!errors.password} aria-describedby="password-error" {...register("password")} />
        <FieldError id="password-error" message={errors.password?.message} />
      </div>
      <SubmitButton className="btn w-full" disabled={isSubmitting}>
        {isSubmitting ? "Creating your account…" : "Create account"}
      </SubmitButton>
    </form>
  );
}
