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
}

type Executor = Pick<Database, "insert">;

/** Writes a message to the outbox, inside the caller's transaction when one is given. */
export async function queueMessage(db: Executor, message: OutgoingMessage): Promise<string> {
  const id = randomUUID();
  await db.insert(schema.outbox).values({ id, ...message, meta: message.meta ?? {} });
  return id;
}
