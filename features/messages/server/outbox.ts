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
  return (await queueMessages(db, [message]))[0] ?? null;
}

/** Rows per insert statement when many messages are queued at once (well under PostgreSQL's 65 535 parameters). */
const QUEUE_CHUNK = 500;

/**
 * Writes many messages in a few statements (one per QUEUE_CHUNK), in the caller's transaction when one is given. Returns
 * the new ids of the messages written; a message whose idempotency key was already queued is skipped.
 */
export async function queueMessages(db: Executor, messagesIn: OutgoingMessage[]): Promise<string[]> {
  // An address at a .invalid domain (RFC 2606) can never receive mail: the placeholder of a profile a coach keeps for an
  // athlete without an address (squads/lib/managed.ts). Such messages are not queued at all.
  const messages = messagesIn.filter((m) => !/\.invalid$/i.test(m.to.trim()));
  const ids: string[] = [];
  for (let i = 0; i < messages.length; i += QUEUE_CHUNK) {
    const values = messages.slice(i, i + QUEUE_CHUNK).map((message) => ({
      id: randomUUID(),
      ...message,
      // A subject is one header line: names that reached it from older data cannot add headers (names are checked at
      // entry).
      subject: message.subject.replace(/[\u0000-\u001F\u007F]+/g, " ").trim(),
      meta: message.meta ?? {},
      headers: message.headers ?? {},
      idempotencyKey: message.idempotencyKey ?? null,
      userId: message.userId ?? null,
    }));
    const rows = await db
      .insert(schema.outbox)
      .values(values)
      .onConflictDoNothing({ target: schema.outbox.idempotencyKey })
      .returning({ id: schema.outbox.id });
    ids.push(...rows.map((r) => r.id));
  }
  return ids;
}
