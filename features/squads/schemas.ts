import { z } from "zod";
import { isSingleLine, SINGLE_LINE_MESSAGE } from "@/features/platform/lib/text";
import { SPORTS } from "@/features/platform/lib/sports";

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

/** A profile a coach sets up for an athlete without an e-mail address yet (a test can be recorded at once). */
export const managedAthleteSchema = z
  .object({
    name: z
      .string()
      .trim()
      .min(2, "Enter the athlete's name (at least 2 characters).")
      .max(80, "Keep the name under 80 characters.")
      .refine(isSingleLine, SINGLE_LINE_MESSAGE),
    sports: z
      .array(z.enum(SPORTS, { error: "Choose a sport from the list." }))
      .min(1, "Choose at least one sport.")
      .max(7),
  })
  .strict();

/** The athlete's own address, to hand a managed profile over to them. */
export const handOverSchema = z.object({ email: inviteSchema.shape.email }).strict();
