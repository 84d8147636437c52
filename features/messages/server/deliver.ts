import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, inArray, lte, sql } from "drizzle-orm";
import { getDb, schema } from "@/db/client";
import { BATCH_LIMIT, sendEmail, sendEmailBatch, sendsBatches, type SendResult } from "./transport";

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

/** How long claimed messages are held for the worker sending them; after a crash another worker takes them then. */
const LEASE_S = 300;

type Row = typeof schema.outbox.$inferSelect;

const envelope = (m: Row) => ({
  to: m.to,
  subject: m.subject,
  html: m.html,
  text: m.text,
  kind: m.kind,
  headers: m.headers,
  idempotencyKey: m.idempotencyKey ?? m.id,
});

/**
 * Sends the outbox's pending messages that are due and marks them sent, exactly once:
 * - Claimed first, in a transaction of their own (SKIP LOCKED, so several workers share): each claimed message gets a
 *   batch key and is held for LEASE_S, so that a worker that stops while sending leaves it to be sent again later.
 * - Through the e-mail service, up to BATCH_LIMIT messages go in one request under the batch's idempotency key. A batch
 *   that fails for now keeps its key and its messages, so its retry is the same request and the service sends it once.
 *   A batch the service refuses (4xx: nothing of it was sent) is sent again one message at a time, each under its own
 *   idempotency key, so that one bad message does not hold back the others. Through SMTP, one message at a time.
 * - A message that cannot be sent now (unreachable, 429, 5xx) waits with exponential backoff; one refused for good is
 *   marked failed.
 */
export async function deliverPending(now = new Date(), limit = 50): Promise<DeliveryReport> {
  const db = getDb();
  const report: DeliveryReport = { sent: 0, retrying: 0, failed: 0 };
  const claimed = await db.transaction(async (tx) => {
    const due = await tx
      .select()
      .from(schema.outbox)
      .where(and(eq(schema.outbox.status, "pending"), lte(schema.outbox.nextAttemptAt, now)))
      .orderBy(asc(schema.outbox.createdAt), asc(schema.outbox.id))
      .limit(limit)
      .for("update", { skipLocked: true });
    if (!due.length) return [];
    // A batch retried is sent whole: its other messages are claimed with it.
    const keys = [...new Set(due.flatMap((m) => (m.batchKey ? [m.batchKey] : [])))];
    const seen = new Set(due.map((m) => m.id));
    const rest = keys.length
      ? (
          await tx
            .select()
            .from(schema.outbox)
            .where(and(eq(schema.outbox.status, "pending"), inArray(schema.outbox.batchKey, keys)))
            .for("update", { skipLocked: true })
        ).filter((m) => !seen.has(m.id))
      : [];
    const rows = [...due, ...rest];
    const fresh = rows.filter((m) => !m.batchKey);
    // Through SMTP every message goes alone ("single-…": sent under its own idempotency key).
    const batching = sendsBatches();
    for (let i = 0; i < fresh.length; i += batching ? BATCH_LIMIT : 1) {
      const key = batching ? `batch-${randomUUID()}` : `single-${fresh[i]!.id}`;
      for (const m of fresh.slice(i, i + (batching ? BATCH_LIMIT : 1))) m.batchKey = key;
    }
    const lease = new Date(now.getTime() + LEASE_S * 1000);
    await tx.execute(sql`
      update outbox o set batch_key = v.key, next_attempt_at = ${lease.toISOString()}::timestamptz
      from json_to_recordset(${JSON.stringify(rows.map((m) => ({ id: m.id, key: m.batchKey })))}::json)
        as v(id text, key text)
      where o.id = v.id`);
    return rows;
  });
  const batches = new Map<string, Row[]>();
  for (const m of claimed) {
    const list = batches.get(m.batchKey!);
    if (list) list.push(m);
    else batches.set(m.batchKey!, [m]);
  }
  const outcomes: { m: Row; r: SendResult; batchKey: string }[] = [];
  for (const [key, unordered] of batches) {
    // A batch is always the same request: its messages in one fixed order (a retry under the same key must match).
    const list = [...unordered].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
    if (key.startsWith("single-") || !sendsBatches()) {
      for (const m of list) outcomes.push({ m, r: await sendEmail(envelope(m)), batchKey: `single-${m.id}` });
      continue;
    }
    const r = await sendEmailBatch(key, list.map(envelope));
    if (r.ok)
      list.forEach((m, i) => outcomes.push({ m, r: { ok: true, providerId: r.providerIds[i]! }, batchKey: key }));
    // A conflict (the key was used with other content) is not retried and not sent one by one: it is marked failed,
    // because part of it may have been sent before.
    else if (r.retry || r.conflict) for (const m of list) outcomes.push({ m, r, batchKey: key });
    // Refused: nothing of the batch was sent. One by one, each under its own key (also when retried later).
    else for (const m of list) outcomes.push({ m, r: await sendEmail(envelope(m)), batchKey: `single-${m.id}` });
  }
  const updates = outcomes.map(({ m, r, batchKey }) => {
    const attempts = m.attempts + 1;
    const base = {
      id: m.id,
      attempts,
      batch_key: batchKey,
      provider_id: null as string | null,
      next: null as string | null,
    };
    if (r.ok) {
      report.sent++;
      return { ...base, status: "sent", provider_id: r.providerId, error: null };
    }
    if (r.retry && attempts < MAX_ATTEMPTS) {
      report.retrying++;
      const next = new Date(now.getTime() + retryDelayS(attempts) * 1000).toISOString();
      return { ...base, status: "pending", error: r.error, next };
    }
    report.failed++;
    return { ...base, status: "failed", error: r.error };
  });
  if (updates.length)
    await db.execute(sql`
      update outbox o set status = v.status, attempts = v.attempts, batch_key = v.batch_key,
        provider_id = coalesce(v.provider_id, o.provider_id), last_error = v.error,
        sent_at = case when v.status = 'sent' then ${now.toISOString()}::timestamptz else o.sent_at end,
        next_attempt_at = coalesce(v.next, o.next_attempt_at)
      from json_to_recordset(${JSON.stringify(updates)}::json)
        as v(id text, status text, attempts int, batch_key text, provider_id text, error text, next timestamptz)
      where o.id = v.id`);
  return report;
}
