import "server-only";
import { randomUUID } from "node:crypto";
import { schema, type Database } from "@/db/client";

export interface OutgoingMessage {
  kind: string;
  to: string;
  subject: string;
  text: string;
  html: string;
  meta?: Record<string, unknown>;
  /** Kind, recipient and date: the same key is queued (and so sent) at most once. */
  idempotencyKey?: string;
  userId?: string;
  headers?: Record<string, string>;
}

type Executor = Pick<Database, "insert">;

/**
 * Writes a message to the outbox, inside the caller's transaction when one is given; the delivery worker sends it. Returns
 * the new id, or null when a message with the same idempotency key was already queued.
 */
export async function queueMessage(db: Executor, message: OutgoingMessage): Promise<string | null> {
  const id = randomUUID();
  // A subject is one header line: names that reached it from older data cannot add headers (names are checked at entry).
  message = { ...message, subject: message.subject.replace(/[\u0000-\u001F\u007F]+/g, " ").trim() };
  const rows = await db
    .insert(schema.outbox)
    .values({
      id,
      ...message,
      meta: message.meta ?? {},
      headers: message.headers ?? {},
      idempotencyKey: message.idempotencyKey ?? null,
      userId: message.userId ?? null,
    })
    .onConflictDoNothing({ target: schema.outbox.idempotencyKey })
    .returning({ id: schema.outbox.id });
  return rows[0]?.id ?? null;
}
