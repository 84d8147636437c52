import { z } from "zod";

const email = z.string().trim().toLowerCase().pipe(z.email("Enter a valid e-mail address."));

export const signInSchema = z.object({
  email,
  password: z.string().min(1, "Enter your password."),
});

export const passwordSchema = z
  .string()
  .min(10, "Use at least 10 characters.")
  .max(128, "Use at most 128 characters.");

export const signUpSchema = z.object({
  name: z.string().trim().min(2, "Enter your name (at least 2 characters).").max(80, "Keep your name under 80 characters."),
  email,
  password: passwordSchema,
});

export const forgotPasswordSchema = z.object({ email });

export const resetPasswordSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });
