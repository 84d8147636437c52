import "server-only";
import { and, asc, eq, lte } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { sendEmail } from "./transport";

/** Waiting time before the n-th retry: 5 s doubling to at most 5 minutes (common practice: exponential backoff). */
export function retryDelayS(attempts: number): number {
  return Math.min(300, 5 * 2 ** Math.max(0, attempts - 1));
}

const MAX_ATTEMPTS = 30;

export interface DeliveryReport {
  sent: number;
  retrying: number;
  failed: number;
}

/**
 * Sends the outbox's pending messages that are due, each with its idempotency key (so a retry after a lost answer does not
 * send twice), and marks them sent. A message the service refuses for good is marked failed; one it could not take now
 * (unreachable, 429, 5xx) waits with exponential backoff. Rows are claimed with SKIP LOCKED, so several workers share.
 */
export async function deliverPending(now = new Date(), limit = 50): Promise<DeliveryReport> {
  const db = getDb();
  const report: DeliveryReport = { sent: 0, retrying: 0, failed: 0 };
  await db.transaction(async (tx) => {
    const due = await tx
      .select()
      .from(schema.outbox)
      .where(and(eq(schema.outbox.status, "pending"), lte(schema.outbox.nextAttemptAt, now)))
      .orderBy(asc(schema.outbox.createdAt))
      .limit(limit)
      .for("update", { skipLocked: true });
    for (const m of due) {
      const r = await sendEmail({
        to: m.to,
        subject: m.subject,
        html: m.html,
        text: m.text,
        kind: m.kind,
        headers: m.headers,
        idempotencyKey: m.idempotencyKey ?? m.id,
      });
      const attempts = m.attempts + 1;
      if (r.ok) {
        await tx
          .update(schema.outbox)
          .set({ status: "sent", attempts, sentAt: now, providerId: r.providerId, lastError: null })
          .where(eq(schema.outbox.id, m.id));
        report.sent++;
      } else if (r.retry && attempts < MAX_ATTEMPTS) {
        await tx
          .update(schema.outbox)
          .set({ attempts, lastError: r.error, nextAttemptAt: new Date(now.getTime() + retryDelayS(attempts) * 1000) })
          .where(eq(schema.outbox.id, m.id));
        report.retrying++;
      } else {
        await tx
          .update(schema.outbox)
          .set({ status: "failed", attempts, lastError: r.error })
          .where(eq(schema.outbox.id, m.id));
        report.failed++;
      }
    }
  });
  return report;
}
