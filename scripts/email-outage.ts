/**
 * `npm run soak:email`: the e-mail service answers 503 for two minutes during a reminder run (the local fake told to
 * fail), while delivery runs as the worker runs it, in real time. Afterwards every reminder must have been delivered
 * exactly once. Reports the counts and how long the last message took. Not part of `npm test` (it takes about 3 minutes).
 */
import { randomUUID } from "node:crypto";
import { applyMigrations } from "../db/migrate";
import { startFakeEmail } from "./fake-email";
import { createDatabase, startThrowawayCluster } from "./postgres";

const ATHLETES = 100;
const OUTAGE_MS = 120_000;
const log = (l: string) => console.log(`[email-outage] ${l}`);

const cluster = await startThrowawayCluster();
const fake = await startFakeEmail({ quiet: true });
try {
  await createDatabase(cluster, "tidemark_mail");
  const url = cluster.url("tidemark_mail");
  await applyMigrations(url);
  Object.assign(process.env, {
    DATABASE_URL: url,
    RESEND_BASE_URL: fake.url,
    BETTER_AUTH_SECRET: "tidemark-outage-secret-0123456789-abcdef",
    BETTER_AUTH_URL: "http://127.0.0.1:3000",
  });
  delete process.env.RESEND_API_KEY;
  delete process.env.TIDEMARK_EMAIL_TRANSPORT;
  const { getDb, schema, closeDb } = await import("../db/client");
  const { queueSessionReminders } = await import("../features/reminders/server/jobs");
  const { deliverPending } = await import("../features/messages/server/deliver");
  const db = getDb();
  const now = new Date();
  const tomorrow = new Date(now.getTime() + 86_400_000).toISOString().slice(0, 10);
  const coachId = randomUUID();
  await db.insert(schema.user).values({ id: coachId, name: "Outage coach", email: "coach@outage.test" });
  for (let a = 0; a < ATHLETES; a++) {
    const id = randomUUID();
    await db.insert(schema.user).values({ id, name: `Athlete ${a}`, email: `athlete${a}@outage.test` });
    // Evening-before reminders at 00:00 UTC: due at once, for tomorrow's session.
    await db
      .insert(schema.athleteProfile)
      .values({ userId: id, timeZone: "UTC", reminderTiming: "evening_before", reminderTime: "00:00" });
    await db.insert(schema.plannedSession).values({
      id: randomUUID(),
      athleteId: id,
      date: tomorrow,
      sport: "running",
      title: "Easy run",
      structure: [{ type: "step", kind: "work", durationS: 2400, zone: 1 }],
      totalS: 2400,
      minutesByZone: [40, 0, 0],
      createdBy: coachId,
    });
  }
  await fetch(`${fake.url}/_fake/fail`, { method: "POST", body: JSON.stringify({ status: 503, forMs: OUTAGE_MS }) });
  const started = Date.now();
  log(`e-mail service down for ${OUTAGE_MS / 1000} s; reminder run…`);
  const queued = await queueSessionReminders(now);
  log(`${queued} reminders queued; delivering every 3 s as the worker does…`);
  let attempts = 0,
    lastSentAt = 0;
  while (Date.now() - started < 8 * 60_000) {
    // The job also runs again now and then, as the schedule would: it must not queue anything twice.
    if (attempts % 20 === 0 && (await queueSessionReminders(new Date())) !== 0)
      throw new Error("a reminder was queued twice");
    const r = await deliverPending(new Date());
    attempts++;
    if (r.sent) lastSentAt = Date.now();
    const pending = (
      await db
        .select({ id: schema.outbox.id })
        .from(schema.outbox)
        .where((await import("drizzle-orm")).eq(schema.outbox.status, "pending"))
    ).length;
    if (!pending) break;
    await new Promise((res) => setTimeout(res, 3000));
  }
  const received = fake.messages.filter((m) => m.kind === "session_reminder");
  const perRecipient = new Map<string, number>();
  for (const m of received) for (const to of m.to) perRecipient.set(to, (perRecipient.get(to) ?? 0) + 1);
  const twice = [...perRecipient.values()].filter((n) => n > 1).length;
  const rows = await db.select({ status: schema.outbox.status, attempts: schema.outbox.attempts }).from(schema.outbox);
  const maxAttempts = Math.max(...rows.map((r) => r.attempts));
  log(
    `delivered ${received.length} of ${queued} reminders to ${perRecipient.size} athletes; sent twice: ${twice}; outbox: ${rows.filter((r) => r.status === "sent").length} sent, ${rows.filter((r) => r.status !== "sent").length} not; at most ${maxAttempts} attempts per message`,
  );
  log(
    `the last one arrived ${((lastSentAt - started) / 1000).toFixed(0)} s after the outage began (it lasted ${OUTAGE_MS / 1000} s; retries back off 5 s doubling to 5 min)`,
  );
  await closeDb();
  process.exitCode = received.length === queued && queued === ATHLETES && twice === 0 ? 0 : 1;
} finally {
  await fake.stop();
  await cluster.stop();
}
