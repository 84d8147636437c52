import { z } from "zod";
import { isSingleLine, SINGLE_LINE_MESSAGE } from "@/features/platform/lib/text";

const email = z.string().trim().toLowerCase().pipe(z.email("Enter a valid e-mail address."));

export const signInSchema = z.object({
  email,
  password: z.string().min(1, "Enter your password."),
});

export const passwordSchema = z.string().min(10, "Use at least 10 characters.").max(128, "Use at most 128 characters.");

/** A person's name: also checked on the server for sign-up and profile changes (auth.ts). */
export const personNameSchema = z
  .string()
  .trim()
  .min(2, "Enter your name (at least 2 characters).")
  .max(80, "Keep your name under 80 characters.")
  .refine(isSingleLine, SINGLE_LINE_MESSAGE);

export const signUpSchema = z.object({
  name: personNameSchema,
  email,
  password: passwordSchema,
});

export const forgotPasswordSchema = z.object({ email });

export const resetPasswordSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });

export const changeNameSchema = z.object({ name: personNameSchema });

export const changePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, "Enter your current password."),
    password: passwordSchema,
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two new passwords differ." });

export const changeEmailSchema = z.object({ newEmail: email });
