import { z } from "zod";

/** Route parameters: a record id, and a token from a link (invitation, reset). */
export const idParam = z.object({ id: z.string().min(1).max(100) });
export const tokenParam = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/) });
