/**
 * Part of `npm run bench`: the planner page's first-load JavaScript, in kB gzip (target ≤ 250). Builds the production app
 * when its sources changed (into .next-test, shared with `npm test`), serves it on a throwaway PostgreSQL with the demo,
 * signs in as the demo head coach, and adds up every script the page's HTML loads, each gzipped as a server would send it.
 */
import zlib from "node:zlib";
import postgres from "postgres";
import { applyMigrations } from "../db/migrate";
import { seedDemoIfEmpty } from "./demo";
import { startAppServer, type AppServer } from "./app-server";
import { ensureBuild } from "./build";
import { createDatabase, freePort, startThrowawayCluster } from "./postgres";

const TARGET_KB = 250;
const cluster = await startThrowawayCluster();
let app: AppServer | undefined;
try {
  await createDatabase(cluster, "tidemark_bench_js");
  const url = cluster.url("tidemark_bench_js");
  await applyMigrations(url);
  await seedDemoIfEmpty(url);
  const port = await freePort();
  const origin = `http://127.0.0.1:${port}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
    DATABASE_URL: url,
    BETTER_AUTH_URL: origin,
    BETTER_AUTH_SECRET: "tidemark-bench-secret-0123456789-abcdefghij",
    TIDEMARK_DIST_DIR: ".next-test",
    TIDEMARK_LOCAL_OUTBOX: "1",
  };
  ensureBuild(".next-test", env, (l) => console.log(`[bench] ${l}`));
  app = await startAppServer({ mode: "start", port, env, quiet: true });
  const signIn = await fetch(`${origin}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin },
    body: JSON.stringify({ email: "coach@northfold.test", password: "northfold-demo" }),
  });
  if (!signIn.ok) throw new Error(`sign-in: ${signIn.status}`);
  const cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  const sql = postgres(url, { max: 1, onnotice: () => {} });
  const [runner] = await sql<{ id: string }[]>`select id from "user" where email = 'runner@northfold.test'`;
  await sql.end();
  const page = await fetch(`${origin}/athletes/${runner!.id}/plan`, { headers: { cookie } });
  if (!page.ok) throw new Error(`planner page: ${page.status}`);
  const html = await page.text();
  // Scripts marked nomodule (legacy polyfills) are skipped by every browser that runs modules, so they do not count.
  const sources = [
    ...new Set(
      [...html.matchAll(/<script([^>]*)>/g)]
        .filter((m) => !/\bnomodule\b/i.test(m[1]!))
        .map((m) => /src="([^"]+)"/.exec(m[1]!)?.[1])
        .filter((x): x is string => !!x),
    ),
  ];
  let gzipBytes = 0;
  for (const src of sources) {
    const body = Buffer.from(await (await fetch(new URL(src.replaceAll("&amp;", "&"), origin))).arrayBuffer());
    gzipBytes += zlib.gzipSync(body).length;
  }
  const kb = gzipBytes / 1024;
  console.log(
    `the planner page's first-load JavaScript: ${kb.toFixed(0)} kB gzip in ${sources.length} scripts (target ≤ ${TARGET_KB}) ${kb <= TARGET_KB ? "OK" : "ABOVE TARGET"}`,
  );
} finally {
  await app?.stop();
  await cluster.stop();
}
