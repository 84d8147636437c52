/**
 * `npm test`: a throwaway PostgreSQL, the unit and integration tests (vitest), then the browser tests (playwright-core
 * driving Debian's chromium) against the production build. Extra arguments go to vitest, e.g. `npm test -- roster`.
 */
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { applyMigrations } from "../db/migrate";
import { seedDemoIfEmpty } from "./demo";
import { startAppServer, type AppServer } from "./app-server";
import { ensureBuild } from "./build";
import { ROOT } from "./env";
import { createDatabase, freePort, startThrowawayCluster, type Cluster } from "./postgres";
import { startFakeEmail, type FakeEmail } from "./fake-email";

const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
const TEST_SECRET = "tidemark-test-secret-not-for-production-0123456789";

function log(line: string) {
  console.log(`[test] ${line}`);
}

function ensureChromium(): void {
  if (fs.existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) {
    throw new Error(`Chromium not found at ${CHROMIUM}. Install it with: sudo apt-get install -y chromium`);
  }
  log("Chromium is missing; installing Debian's chromium package (apt-get install -y chromium)…");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  let r = spawnSync("apt-get", ["install", "-y", "chromium"], { stdio: "inherit", env });
  if (r.status !== 0) {
    spawnSync("apt-get", ["update"], { stdio: "inherit", env });
    r = spawnSync("apt-get", ["install", "-y", "chromium"], { stdio: "inherit", env });
  }
  if (r.status !== 0 || !fs.existsSync(CHROMIUM)) throw new Error("Installing chromium with apt-get failed.");
}

/** Runs vitest without blocking this process, which serves the e-mail fake the tests talk to. */
function vitest(projects: string[], env: NodeJS.ProcessEnv, extra: string[]): Promise<number> {
  const args = [
    path.join(ROOT, "node_modules/vitest/vitest.mjs"),
    "run",
    "--passWithNoTests",
    ...projects.flatMap((p) => ["--project", p]),
    ...extra,
  ];
  const child = spawn(process.execPath, args, { cwd: ROOT, stdio: "inherit", env });
  return new Promise((resolve) => child.on("exit", (code) => resolve(code ?? 1)));
}

async function main(): Promise<number> {
  const extra = process.argv.slice(2);
  let cluster: Cluster | undefined;
  let app: AppServer | undefined;
  let fake: FakeEmail | undefined;
  const cleanup = async () => {
    await app?.stop().catch(() => {});
    await fake?.stop().catch(() => {});
    await cluster?.stop().catch((e) => console.error(String(e)));
  };
  process.on("SIGINT", () => void cleanup().then(() => process.exit(130)));
  process.on("SIGTERM", () => void cleanup().then(() => process.exit(143)));
  try {
    ensureChromium();
    log("Starting a throwaway PostgreSQL…");
    cluster = await startThrowawayCluster(log);
    await createDatabase(cluster, "tidemark_test");
    const integrationUrl = cluster.url("tidemark_test");
    await applyMigrations(integrationUrl);
    // The local fake of the e-mail API, on a free port unless FAKE_EMAIL_PORT is set (a running `npm start` holds 4010).
    fake = await startFakeEmail({
      port: process.env.FAKE_EMAIL_PORT ? Number(process.env.FAKE_EMAIL_PORT) : 0,
      smtpPort: 0,
      quiet: true,
    });
    log(`E-mail fake on ${fake.url}`);
    const baseEnv: NodeJS.ProcessEnv = {
      ...process.env,
      RESEND_BASE_URL: fake.url,
      FAKE_EMAIL_URL: fake.url,
      NODE_ENV: "test",
      BETTER_AUTH_SECRET: TEST_SECRET,
      NEXT_TELEMETRY_DISABLED: "1",
    };

    log("Unit and integration tests…");
    const first = await vitest(
      ["unit", "integration"],
      {
        ...baseEnv,
        DATABASE_URL: integrationUrl,
        BETTER_AUTH_URL: "http://127.0.0.1:3999",
        // The in-process requests carry X-Forwarded-For as a trusted proxy would set it (one address per test browser).
        TIDEMARK_CLIENT_IP_HEADER: "x-forwarded-for",
        TIDEMARK_LOCAL_OUTBOX: "1",
      },
      extra,
    );
    if (first !== 0) return first;
    if (process.env.TIDEMARK_SKIP_BROWSER === "1") {
      log("TIDEMARK_SKIP_BROWSER=1: skipping the build and the browser tests.");
      return 0;
    }

    log("Browser tests: demo database, production build, app server…");
    await createDatabase(cluster, "tidemark_browser");
    const browserUrl = cluster.url("tidemark_browser");
    await applyMigrations(browserUrl);
    await seedDemoIfEmpty(browserUrl);
    const port = await freePort();
    const origin = `http://127.0.0.1:${port}`;
    const appEnv: NodeJS.ProcessEnv = {
      ...baseEnv,
      NODE_ENV: "production",
      DATABASE_URL: browserUrl,
      BETTER_AUTH_URL: origin,
      TIDEMARK_LOCAL_OUTBOX: "1",
      TIDEMARK_DIST_DIR: ".next-test",
      // Every browser test signs in from 127.0.0.1; the limit itself is tested in the integration tests.
      TIDEMARK_SIGN_IN_LIMIT_PER_MIN: "200",
    };
    ensureBuild(".next-test", appEnv, log);
    app = await startAppServer({ mode: "start", port, env: appEnv, quiet: true });
    // The browser tests also run jobs in-process (the worker's functions), so they share the app's origin and secret.
    return await vitest(
      ["browser"],
      {
        ...baseEnv,
        TIDEMARK_BASE_URL: origin,
        BETTER_AUTH_URL: origin,
        CHROMIUM_PATH: CHROMIUM,
        DATABASE_URL: browserUrl,
      },
      extra,
    );
  } finally {
    await cleanup();
  }
}

main().then(
  (code) => process.exit(code),
  (e) => {
    console.error(e instanceof Error ? e.message : e);
    process.exit(1);
  },
);
