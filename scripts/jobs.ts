/**
 * Operator command for the background jobs: `npm run jobs -- list` names them; `npm run jobs -- run <job> [--now <ISO
 * instant>]` runs one now (optionally as if the clock showed that instant), then sends what it queued.
 */
import { closeDb } from "../db/client";
import { deliverPending } from "../features/messages/server/deliver";
import { isJobName, JOBS } from "../features/reminders/server/registry";
import { databaseUrlFromEnvOrLocal, localMailEnv } from "./env";

async function main(args: string[]): Promise<number> {
  const [command, name] = args;
  if (command === "list" || !command) {
    for (const [n, j] of Object.entries(JOBS)) console.log(`${n.padEnd(18)} ${j.cron.padEnd(14)} ${j.description}`);
    return 0;
  }
  if (command !== "run" || !name) {
    console.error("Usage: npm run jobs -- list | run <job> [--now <ISO instant>]");
    return 2;
  }
  if (!isJobName(name)) {
    console.error(`No job named "${name}". Jobs: ${Object.keys(JOBS).join(", ")}.`);
    return 2;
  }
  const at = args.indexOf("--now");
  const now = at >= 0 ? new Date(args[at + 1] ?? "") : new Date();
  if (Number.isNaN(now.getTime())) {
    console.error('--now takes an ISO instant, e.g. "2027-01-15T06:00:00Z".');
    return 2;
  }
  process.env.DATABASE_URL ??= databaseUrlFromEnvOrLocal();
  for (const [k, v] of Object.entries(localMailEnv())) process.env[k] ??= v;
  const result = await JOBS[name].run(now);
  console.log(`${name} at ${now.toISOString()}: ${JSON.stringify(result)}`);
  if (name !== "deliver-outbox") console.log(`deliver-outbox: ${JSON.stringify(await deliverPending(new Date()))}`);
  await closeDb();
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (e) => {
    console.error(e instanceof Error ? e.message : e);
    process.exit(1);
  },
);
