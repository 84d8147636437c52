import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb, schema } from "@/db/client";

export { ACCOUNT_MESSAGE_KINDS, localFakeTransport, localOutboxEnabled, maskLinks } from "../lib/outbox-view";

export async function listOutbox(limit = 100) {
  return getDb()
    .select({
      id: schema.outbox.id,
      kind: schema.outbox.kind,
      to: schema.outbox.to,
      subject: schema.outbox.subject,
      status: schema.outbox.status,
      createdAt: schema.outbox.createdAt,
    })
    .from(schema.outbox)
    .orderBy(desc(schema.outbox.createdAt))
    .limit(limit);
}

export async function getOutboxMessage(id: string) {
  const [row] = await getDb().select().from(schema.outbox).where(eq(schema.outbox.id, id));
  return row ?? null;
}
