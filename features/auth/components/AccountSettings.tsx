"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { authErrorMessage, FieldError, FormAlert, FormNotice } from "@/features/platform/components/form-bits";
import { SubmitButton } from "@/features/platform/components/SubmitButton";
import { authClient } from "../client";
import { changeEmailSchema, changeNameSchema, changePasswordSchema } from "../schemas";

/**
 * The signed-in person's own name, e-mail address and password (every role). Changing the password signs out every other
 * device; a new address is approved from the old one and confirmed from the new one.
 */
export function AccountSettings({ name, email }: { name: string; email: string }) {
  const router = useRouter();
  const [nameSaved, setNameSaved] = useState(false);
  const [nameError, setNameError] = useState<string>();
  const nameForm = useForm<z.infer<typeof changeNameSchema>>({
    resolver: zodResolver(changeNameSchema),
    defaultValues: { name },
  });
  const [passwordSaved, setPasswordSaved] = useState(false);
  const [passwordError, setPasswordError] = useState<string>();
  const passwordForm = useForm<z.infer<typeof changePasswordSchema>>({
    resolver: zodResolver(changePasswordSchema),
    defaultValues: { currentPassword: "", password: "", confirm: "" },
  });

  const [emailSent, setEmailSent] = useState<string>();
  const [emailError, setEmailError] = useState<string>();
  const emailForm = useForm<z.infer<typeof changeEmailSchema>>({
    resolver: zodResolver(changeEmailSchema),
    defaultValues: { newEmail: "" },
  });
  const saveEmail = emailForm.handleSubmit(async (v) => {
    setEmailSent(undefined);
    setEmailError(undefined);
    if (v.newEmail === email.toLowerCase()) return setEmailError("That is the address you sign in with already.");
    const { error } = await authClient.changeEmail({ newEmail: v.newEmail, callbackURL: "/settings" });
    if (error) return setEmailError(authErrorMessage(error));
    emailForm.reset();
    setEmailSent(v.newEmail);
  });

  const saveName = nameForm.handleSubmit(async (v) => {
    setNameSaved(false);
    setNameError(undefined);
    const { error } = await authClient.updateUser({ name: v.name });
    if (error) return setNameError(authErrorMessage(error));
    setNameSaved(true);
    router.refresh();
  });
  const savePassword = passwordForm.handleSubmit(async (v) => {
    setPasswordSaved(false);
    setPasswordError(undefined);
    const { error } = await authClient.changePassword({
      currentPassword: v.currentPassword,
      newPassword: v.password,
      revokeOtherSessions: true,
    });
    if (error) return setPasswordError(authErrorMessage(error));
    passwordForm.reset();
    setPasswordSaved(true);
  });
  const ne = nameForm.formState.errors,
    pe = passwordForm.formState.errors,
    ee = emailForm.formState.errors;
  return (
    <div className="space-y-6">
      <form onSubmit={saveName} noValidate className="space-y-3">
        <FormAlert>{nameError}</FormAlert>
        {nameSaved ? <FormNotice>Saved your name.</FormNotice> : null}
        <div>
          <label htmlFor="account-name" className="field-label">
            Your name
          </label>
          <input
            id="account-name"
            autoComplete="name"
            className="field-input"
            aria-invalid={!!ne.name}
            aria-describedby="account-name-error"
            // In the server's HTML too, so the field never shows empty while the page is still loading.
            defaultValue={name}
            {...nameForm.register("name")}
          />
          <FieldError id="account-name-error" message={ne.name?.message} />
        </div>
        <SubmitButton className="btn" disabled={nameForm.formState.isSubmitting}>
          Save my name
        </SubmitButton>
      </form>
      <form onSubmit={saveEmail} noValidate className="space-y-3">
        <h3 className="font-semibold">Change your e-mail address</h3>
        <p className="text-sm text-ink-soft">
          You sign in as <span className="font-semibold">{email}</span>. A link to approve the change goes to this
          address first, then a link to confirm the new one goes to it; the account moves only then.
        </p>
        <FormAlert>{emailError}</FormAlert>
        {emailSent ? (
          <FormNotice>
            Sent. Open the message at {email} to approve the move to {emailSent}, then the one that arrives at{" "}
            {emailSent}.
          </FormNotice>
        ) : null}
        <div>
          <label htmlFor="account-new-email" className="field-label">
            New e-mail address
          </label>
          <input
            id="account-new-email"
            type="email"
            autoComplete="email"
            className="field-input"
            aria-invalid={!!ee.newEmail}
            aria-describedby="account-new-email-error"
            {...emailForm.register("newEmail")}
          />
          <FieldError id="account-new-email-error" message={ee.newEmail?.message} />
        </div>
        <SubmitButton className="btn" disabled={emailForm.formState.isSubmitting}>
          Send the links
        </SubmitButton>
      </form>
      <form onSubmit={savePassword} noValidate className="space-y-3">
        <h3 className="font-semibold">Change your password</h3>
        <p className="text-sm text-ink-soft">
          You sign in as <span className="font-semibold">{email}</span>. A new password signs you out on every other
          device.
        </p>
        <FormAlert>{passwordError}</FormAlert>
        {passwordSaved ? <FormNotice>Your password is changed.</FormNotice> : null}
        {(
          [
            ["currentPassword", "Current password", "current-password"],
            ["password", "New password (at least 10 characters)", "new-password"],
            ["confirm", "New password again", "new-password"],
          ] as const
        ).map(([field, label, autoComplete]) => (
          <div key={field}>
            <label htmlFor={`account-${field}`} className="field-label">
              {label}
            </label>
            <input
              id={`account-${field}`}
              type="password"
              autoComplete={autoComplete}
              className="field-input"
              aria-invalid={!!pe[field]}
              aria-describedby={`account-${field}-error`}
              {...passwordForm.register(field)}
            />
            <FieldError id={`account-${field}-error`} message={pe[field]?.message} />
          </div>
        ))}
        <SubmitButton className="btn" disabled={passwordForm.formState.isSubmitting}>
          Change my password
        </SubmitButton>
      </form>
    </div>
  );
}
