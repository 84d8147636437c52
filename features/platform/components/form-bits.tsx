import type { ReactNode } from "react";

export function FieldError({ id, message }: { id: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} role="alert" className="field-error">
      {message}
    </p>
  );
}

export function FormAlert({ children }: { children?: ReactNode }) {
  if (!children) return null;
  return (
    <div role="alert" className="rounded-md border border-alert/40 bg-alert-wash px-3 py-2 text-sm text-alert">
      {children}
    </div>
  );
}

export function FormNotice({ children }: { children?: ReactNode }) {
  if (!children) return null;
  return (
    <div role="status" className="rounded-md border border-tide/40 bg-tide-wash px-3 py-2 text-sm text-tide-deep">
      {children}
    </div>
  );
}

/** A message for an auth error, with the usual cases spelled out. */
export function authErrorMessage(
  error: { status?: number; message?: string; code?: string } | null | undefined,
): string {
  if (!error) return "Something went wrong. Please try again.";
  if (error.code === "SIGN_IN_PAUSED" && error.message) return error.message;
  if (error.status === 429) return "Too many attempts. Wait a minute, then try again.";
  if (error.code === "INVALID_EMAIL_OR_PASSWORD") return "That e-mail and password do not match an account.";
  if (error.code === "USER_ALREADY_EXISTS" || error.code === "USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL")
    return "An account with this e-mail already exists. Sign in instead.";
  return error.message || "Something went wrong. Please try again.";
}
