/**
 * The background worker `npm start` runs beside the app: pg-boss schedules and runs the jobs (reminders, digests and
 * delivery, with retries and backoff), and a short loop sends newly queued messages within seconds. Any number of workers
 * can run: each scheduled run is a pg-boss job taken by one worker, and deliveries claim rows with SKIP LOCKED.
 */
import PgBoss from "pg-boss";
import { closeDb } from "../db/client";
import { deliverPending } from "../features/messages/server/deliver";
import { JOBS } from "../features/reminders/server/registry";
import { config, signingSecret } from "../features/platform/server/config";

function log(line: string) {
  console.log(`[worker] ${line}`);
}

const url = config().database.url;
if (!url) throw new Error("DATABASE_URL is not set; the worker is started by `npm start`.");
// The reminders carry signed unsubscribe links: no worker without the signing secret.
signingSecret();
const boss = new PgBoss({ connectionString: url, schema: "pgboss", application_name: "tidemark-worker" });
boss.on("error", (e) => log(`queue error: ${e.message}`));
await boss.start();
for (const [name, job] of Object.entries(JOBS)) {
  await boss.createQueue(name, { name, retryLimit: 8, retryDelay: 15, retryBackoff: true, expireInSeconds: 600 });
  await boss.schedule(name, job.cron);
  await boss.work(name, async () => {
    const result = await job.run(new Date());
    // Reminder jobs answer how many messages they queued; say so only when there were some.
    if (name !== "deliver-outbox" && typeof result === "number" && result > 0)
      log(`${name}: ${result} message(s) queued`);
  });
}

let delivering = false;
const tick = setInterval(() => {
  if (delivering) return;
  delivering = true;
  deliverPending(new Date())
    .then((r) => {
      if (r.sent || r.retrying || r.failed)
        log(`delivered ${r.sent}, waiting to retry ${r.retrying}, refused ${r.failed}`);
    })
    .catch((e) => log(`delivery failed: ${e instanceof Error ? e.message : String(e)}`))
    .finally(() => (delivering = false));
}, 3000);
log(`running ${Object.keys(JOBS).join(", ")}`);

const stop = async () => {
  clearInterval(tick);
  await boss.stop({ graceful: true, timeout: 5000 }).catch(() => undefined);
  await closeDb();
  process.exit(0);
};
process.on("SIGTERM", () => void stop());
process.on("SIGINT", () => void stop());
