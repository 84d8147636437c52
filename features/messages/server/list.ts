import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb, schema } from "@/db/client";

import { config } from "@/features/platform/server/config";
import { localOutboxEnabled as outboxEnabledFor } from "../lib/outbox-view";

export { ACCOUNT_MESSAGE_KINDS, maskLinks } from "../lib/outbox-view";

/** Whether the local outbox page exists in this process (see outbox-view.ts). */
export function localOutboxEnabled(): boolean {
  return outboxEnabledFor(config().mail);
}

/** The local e-mail fake's own outbox page. */
export function fakeEmailOutboxUrl(): string {
  return `${config().mail.fakeUrl}/outbox`;
}

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
