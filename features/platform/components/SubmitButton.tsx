"use client";
import type { ReactNode } from "react";
import { useHydrated } from "./use-hydrated";

/**
 * A form's submit button, disabled until the page's script has taken over: a form sent before then would go out as a
 * plain browser submission (the fields, passwords included, in the address) instead of through the app.
 */
export function SubmitButton({
  className = "btn",
  disabled = false,
  children,
}: {
  className?: string;
  disabled?: boolean;
  children: ReactNode;
}) {
  const hydrated = useHydrated();
  return (
    <button type="submit" className={className} disabled={disabled || !hydrated}>
      {children}
    </button>
  );
}
