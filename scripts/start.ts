/**
 * `npm start`: PostgreSQL on loopback, migrations, demo data when empty, a production build when needed, and the app on
 * http://127.0.0.1:3000. `npm run dev` does the same with the development server. Ctrl-C stops everything cleanly.
 */
import type { ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { applyMigrations } from "../db/migrate";
import { DEMO_ADMIN, DEMO_PASSWORD, DEMO_PEOPLE, seedDemoIfEmpty } from "./demo";
import { startAppServer } from "./app-server";
import { ensureBuild } from "./build";
import { spawn } from "node:child_process";
import { DATA_DIR, intFromEnv, localMailEnv } from "./env";
import { startFakeEmail, type FakeEmail } from "./fake-email";
import { createDatabase, startCluster, type Cluster } from "./postgres";

const dev = process.argv.includes("--dev");
const LOCK = path.join(DATA_DIR, "tidemark.lock");

function log(line: string) {
  console.log(`[tidemark] ${line}`);
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

function takeLock(appPort: number): void {
  fs.mkdirSync(DATA_DIR, { recursive: true });
  if (fs.existsSync(LOCK)) {
    const [pidText, portText] = fs.readFileSync(LOCK, "utf8").split(" ");
    const pid = Number(pidText);
    if (pid && alive(pid)) {
      console.error(
        `Tidemark is already running (process ${pid}, http://127.0.0.1:${portText?.trim() ?? "3000"}). ` +
          "Use that one, or stop it with Ctrl-C in its terminal before starting again.",
      );
      process.exit(1);
    }
  }
  fs.writeFileSync(LOCK, `${process.pid} ${appPort}`);
}

function releaseLock(): void {
  try {
    if (fs.readFileSync(LOCK, "utf8").startsWith(`${process.pid} `)) fs.rmSync(LOCK);
  } catch {
    /* already gone */
  }
}

async function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once("error", () => resolve(false));
    srv.listen(port, "127.0.0.1", () => srv.close(() => resolve(true)));
  });
}

async function main() {
  const appPort = intFromEnv("PORT", 3000);
  const pgPort = intFromEnv("PGPORT", 54329);
  takeLock(appPort);
  if (!(await portIsFree(appPort))) {
    releaseLock();
    console.error(
      `Port ${appPort} on 127.0.0.1 is in use by another program. Stop it, or start with PORT=<other port> npm start.`,
    );
    process.exit(1);
  }

  let cluster: Cluster | undefined;
  let app: ChildProcess | undefined;
  let worker: ChildProcess | undefined;
  let fake: FakeEmail | undefined;
  let stopping = false;
  const stop = async (code: number) => {
    if (stopping) return;
    stopping = true;
    log("Stopping…");
    for (const child of [app, worker]) {
      if (child && child.exitCode === null) {
        child.kill("SIGTERM");
        await new Promise((r) => child.once("exit", r));
      }
    }
    await fake?.stop();
    if (cluster) {
      await cluster.stop().catch((e) => console.error(String(e)));
      log("PostgreSQL stopped.");
    }
    releaseLock();
    process.exit(code);
  };
  process.on("SIGINT", () => void stop(0));
  process.on("SIGTERM", () => void stop(0));

  try {
    log(`Starting PostgreSQL on 127.0.0.1:${pgPort} (data in .data/postgres)…`);
    cluster = await startCluster({ dataDir: path.join(DATA_DIR, "postgres"), port: pgPort, log });
    await createDatabase(cluster, "tidemark");
    const databaseUrl = cluster.url("tidemark");
    log("Applying migrations…");
    await applyMigrations(databaseUrl);
    if (await seedDemoIfEmpty(databaseUrl)) log("Loaded the Northfold Endurance demo.");

    const origin = `http://127.0.0.1:${appPort}`;
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      ...localMailEnv(),
      DATABASE_URL: databaseUrl,
      BETTER_AUTH_URL: origin,
      NEXT_TELEMETRY_DISABLED: "1",
    };
    if (env.RESEND_BASE_URL?.startsWith("http://127.0.0.1:")) {
      fake = await startFakeEmail({
        port: intFromEnv("FAKE_EMAIL_PORT", 4010),
        smtpPort: intFromEnv("FAKE_SMTP_PORT", 2525),
        quiet: true,
      });
      // The outbox page (site operators only) exists only while the local fake is the transport, never with real e-mail.
      env.TIDEMARK_LOCAL_OUTBOX = "1";
      env.FAKE_EMAIL_URL = fake.url;
      log(`Local e-mail fake on ${fake.url} (SMTP on 127.0.0.1:${fake.smtpPort}); what was sent: ${fake.url}/outbox`);
    }
    log("Starting the background worker (reminders, digests, e-mail delivery)…");
    worker = spawn(
      process.execPath,
      ["--import", "tsx", "--import", "./scripts/register-server.mjs", "scripts/worker.ts"],
      {
        cwd: path.resolve(import.meta.dirname, ".."),
        // Outside development the worker runs React's production build too (e-mails render several times faster).
        env: { ...env, NODE_ENV: dev ? "development" : "production" },
        stdio: "inherit",
      },
    );
    worker.on("exit", (code) => {
      if (!stopping) {
        console.error(`The background worker exited (code ${code}).`);
        void stop(1);
      }
    });
    if (!dev) ensureBuild(".next", { ...env, NODE_ENV: "production" }, log);
    log(dev ? "Starting the development server…" : "Starting the app server…");
    const server = await startAppServer({ mode: dev ? "dev" : "start", port: appPort, env });
    app = server.process;
    app.on("exit", (code) => {
      if (!stopping) {
        console.error(`The app server exited (code ${code}).`);
        void stop(1);
      }
    });
    console.log("");
    log(`Tidemark is running at ${origin}`);
    log(`Demo sign-ins (password "${DEMO_PASSWORD}"):`);
    for (const p of DEMO_PEOPLE) log(`  ${p.email.padEnd(28)} ${p.role.replace("_", " ")}`);
    log(`  ${DEMO_ADMIN.email.padEnd(28)} site operator (the outbox page; no squad)`);
    log(
      fake
        ? `Messages the app queues appear at ${origin}/outbox (sign in as ${DEMO_ADMIN.email}); what the e-mail fake received, links included, at ${fake.url}/outbox. Press Ctrl-C to stop.`
        : "Press Ctrl-C to stop.",
    );
  } catch (e) {
    console.error(e instanceof Error ? e.message : String(e));
    await stop(1);
  }
}

void main();
