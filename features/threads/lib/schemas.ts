import { z } from "zod";

import { MESSAGE_MAX } from "./limits";

export { MESSAGE_MAX };

/** A message: 1–1000 characters of text after trimming; line breaks are kept, other control characters refused. */
export const messageSchema = z
  .object({
    body: z
      .string({ error: "Write a message." })
      .transform((s) => s.replace(/\r\n?/g, "\n").trim())
      .pipe(
        z
          .string()
          .min(1, "Write a message.")
          .max(MESSAGE_MAX, `Keep a message under ${MESSAGE_MAX} characters.`)
          .refine((s) => !/[\u0000-\u0009\u000B-\u001F\u007F]/.test(s), "A message holds text and line breaks only."),
      ),
  })
  .strict();
