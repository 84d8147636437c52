import { z } from "zod";
import { isSingleLine, SINGLE_LINE_MESSAGE } from "@/features/platform/lib/text";

export const squadRoleSchema = z.enum(["head_coach", "coach", "athlete"], {
  error: "Role must be head coach, coach or athlete.",
});

export const ROLE_LABELS = { head_coach: "head coach", coach: "coach", athlete: "athlete" } as const;

export const createSquadSchema = z.object({
  name: z
    .string()
    .trim()
    .min(2, "Give the squad a name of at least 2 characters.")
    .max(80, "Keep the name under 80 characters.")
    .refine(isSingleLine, SINGLE_LINE_MESSAGE),
});

export const inviteSchema = z.object({
  email: z.string().trim().toLowerCase().pipe(z.email("Enter a valid e-mail address.")),
  role: z.enum(["coach", "athlete"], { error: "Invite as coach or athlete." }),
});

export type InviteInput = z.infer<typeof inviteSchema>;
