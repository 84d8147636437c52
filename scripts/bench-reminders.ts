/**
 * Part of `npm run bench` (run by it with the react-server condition): session reminders in bulk. N athletes (10 000 by
 * default; BENCH_REMINDERS=n for another size) each have a session today with steps in their own zones; the reminder job
 * queues one e-mail per athlete and the delivery worker sends them to the local fake of the e-mail service (in its own
 * process). The floor, measured in the same run against the same fake: a plain loop of the same N messages POSTed one
 * after another from one process. Target ≤ 1.5. Afterwards it checks that each athlete got exactly one message, and that
 * running the job and the worker again sends nothing more.
 */
import { spawn } from "node:child_process";
import { once } from "node:events";
import { createServer } from "node:net";
import { applyMigrations } from "../db/migrate";
import { createDatabase, startThrowawayCluster } from "./postgres";

const N = Number(process.env.BENCH_REMINDERS ?? 10_000);
// As the worker runs outside development (scripts/start.ts): React's production build renders the e-mails.
(process.env as Record<string, string | undefined>).NODE_ENV ??= "production";

async function freePort(): Promise<number> {
  const s = createServer();
  s.listen(0, "127.0.0.1");
  await once(s, "listening");
  const port = (s.address() as { port: number }).port;
  await new Promise((r) => s.close(r));
  return port;
}

const port = await freePort();
const fake = spawn(process.execPath, ["--import", "tsx", new URL("./fake-email.ts", import.meta.url).pathname], {
  env: { ...process.env, FAKE_EMAIL_PORT: String(port), FAKE_SMTP_PORT: String(await freePort()) },
  stdio: "inherit",
});
const fakeUrl = `http://127.0.0.1:${port}`;
const cluster = await startThrowawayCluster();
try {
  for (let i = 0; ; i++) {
    try {
      if ((await fetch(`${fakeUrl}/outbox.json`)).ok) break;
    } catch {
      // not up yet
    }
    if (i > 200) throw new Error("the e-mail fake did not start");
    await new Promise((r) => setTimeout(r, 50));
  }
  await createDatabase(cluster, "tidemark_bench_reminders");
  const url = cluster.url("tidemark_bench_reminders");
  await applyMigrations(url);
  process.env.DATABASE_URL = url;
  process.env.RESEND_BASE_URL = fakeUrl;
  process.env.TIDEMARK_PUBLIC_URL ??= "http://127.0.0.1:3000";
  process.env.BETTER_AUTH_SECRET ??= "bench-secret-bench-secret-bench-secret-0123";
  const { getDb, closeDb } = await import("../db/client");
  const { sql } = await import("drizzle-orm");
  const { queueSessionReminders } = await import("../features/reminders/server/jobs");
  const { deliverPending } = await import("../features/messages/server/deliver");
  const db = getDb();
  // Reminders are due from 06:00 UTC on the day of the session ("morning of").
  const now = new Date();
  now.setUTCHours(12, 0, 0, 0);
  const today = now.toISOString().slice(0, 10);
  const loadStart = performance.now();
  await db.execute(sql`
    insert into "user" (id, name, email)
    select 'ath-' || i, 'Athlete ' || i, 'athlete' || i || '@bench.test' from generate_series(1, ${N}) i`);
  await db.execute(sql`
    insert into athlete_profile (user_id, sports, time_zone, reminder_timing, reminder_time, remind_sessions)
    select 'ath-' || i, array['running'], 'UTC', 'morning_of', '06:00', true from generate_series(1, ${N}) i`);
  await db.execute(sql`
    insert into zone_set (id, athlete_id, sport, effective_from, vt1, vt2, source)
    select 'zs-' || i, 'ath-' || i, 'running', ${today}::date - 30,
      json_build_object('hrBpm', 140 + i % 10, 'speedKmh', 11 + (i % 5) * 0.2)::jsonb,
      json_build_object('hrBpm', 165 + i % 10, 'speedKmh', 14 + (i % 5) * 0.2)::jsonb, 'manual'
    from generate_series(1, ${N}) i`);
  await db.execute(sql`
    insert into planned_session (id, athlete_id, date, sport, title, structure, total_s, minutes_by_zone, created_by)
    select 'ps-' || i, 'ath-' || i, ${today}, 'running', 'Tempo intervals',
      '[{"type":"step","kind":"warmup","durationS":900,"zone":1},{"type":"repeat","times":4,"steps":[{"type":"step","kind":"work","durationS":300,"zone":2},{"type":"step","kind":"recovery","durationS":120,"zone":1}]},{"type":"step","kind":"cooldown","durationS":600,"zone":1}]'::jsonb,
      3180, '[38, 20, 0]'::jsonb, null
    from generate_series(1, ${N}) i`);
  await db.execute(sql`analyze`);
  const loadMs = performance.now() - loadStart;

  // The job and the worker, as the scheduler runs them, until the outbox is empty.
  const start = performance.now();
  const queued = await queueSessionReminders(now);
  const queuedMs = performance.now() - start;
  let sent = 0;
  for (;;) {
    const r = await deliverPending(new Date(), 500);
    sent += r.sent;
    if (r.retrying || r.failed) throw new Error(`delivery: ${JSON.stringify(r)}`);
    if (r.sent === 0) break;
  }
  const pipeline = performance.now() - start;
  if (queued !== N || sent !== N) throw new Error(`queued ${queued}, sent ${sent}, expected ${N}`);

  // Exactly once: the job and the worker again send nothing more, and the fake holds one message per athlete.
  if ((await queueSessionReminders(now)) !== 0) throw new Error("the job queued reminders twice");
  if ((await deliverPending(new Date(), 500)).sent !== 0) throw new Error("the worker sent twice");
  const received = (await (await fetch(`${fakeUrl}/outbox.json`)).json()) as { to: string[] }[];
  const perAthlete = new Map<string, number>();
  for (const m of received) perAthlete.set(m.to[0]!, (perAthlete.get(m.to[0]!) ?? 0) + 1);
  if (perAthlete.size !== N || [...perAthlete.values()].some((c) => c !== 1))
    throw new Error(`the fake holds ${received.length} messages for ${perAthlete.size} athletes`);

  // The floor: the same messages, POSTed one after another from this process to the same fake.
  await fetch(`${fakeUrl}/_fake/reset`, { method: "POST" });
  const rows = await db.execute<{
    to: string;
    subject: string;
    html: string;
    text: string;
    key: string;
    kind: string;
    headers: Record<string, string>;
  }>(
    sql`select to_address as "to", subject, html_body as html, text_body as text, idempotency_key as key, kind, headers
      from outbox order by created_at`,
  );
  const floorStart = performance.now();
  for (const m of rows) {
    const r = await fetch(`${fakeUrl}/emails`, {
      method: "POST",
      headers: {
        "content-type": "application/json",
        authorization: "Bearer re_local_fake_key",
        "idempotency-key": m.key,
      },
      body: JSON.stringify({
        from: "Tidemark <no-reply@tidemark.test>",
        to: [m.to],
        subject: m.subject,
        html: m.html,
        text: m.text,
        headers: m.headers,
        tags: [{ name: "kind", value: m.kind }],
      }),
    });
    if (!r.ok) throw new Error(`floor POST answered ${r.status}`);
    await r.arrayBuffer();
  }
  const floor = performance.now() - floorStart;
  const size = (
    await db.execute<{ s: string }>(sql`select pg_size_pretty(pg_database_size(current_database())) as s`)
  )[0]!.s;
  console.log(
    `floor: ${N} reminder e-mails POSTed one after another to the e-mail fake = 1 (${(floor / 1000).toFixed(1)} s; database ${size}, loaded in ${(loadMs / 1000).toFixed(1)} s)`,
  );
  const ratio = pipeline / floor;
  console.log(
    `${N} session reminders queued by the job and delivered by the worker: ${ratio.toFixed(3)} × floor (target ≤ 1.5) ${ratio <= 1.5 ? "OK" : "ABOVE TARGET"}; queueing alone ${(queuedMs / floor).toFixed(3)} ×; each athlete got exactly one`,
  );
  await closeDb();
} finally {
  await cluster.stop();
  fake.kill("SIGTERM");
}
