/**
 * Part of `npm run bench`: pages that settle. The production build on the demo database, in Debian's chromium through
 * playwright-core: for the plan, roster, test and today pages, the time from navigation until no request is pending
 * (none for 500 ms; the time is taken at the last answer), median of 10 loads each, against a static page of the same
 * app (its "not found" page, with the same layout and scripts) measured in the same run. Target ≤ 2 each.
 * SETTLE_DEBUG=1 lists each load's requests with their start times.
 */
import postgres from "postgres";
import type { Page } from "playwright-core";
import { launchChromium } from "./chromium";
import { applyMigrations } from "../db/migrate";
import { startAppServer } from "./app-server";
import { ensureBuild } from "./build";
import { DEMO_PASSWORD, seedDemoIfEmpty } from "./demo";
import { createDatabase, freePort, startThrowawayCluster } from "./postgres";

const LOADS = 10;

const cluster = await startThrowawayCluster();
let app: Awaited<ReturnType<typeof startAppServer>> | undefined;
try {
  await createDatabase(cluster, "tidemark_settle");
  const url = cluster.url("tidemark_settle");
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
    BETTER_AUTH_SECRET: "tidemark-settle-secret-0123456789-abcdefghij",
    TIDEMARK_DIST_DIR: ".next-test",
    TIDEMARK_LOCAL_OUTBOX: "1",
    TIDEMARK_SIGN_IN_LIMIT_PER_MIN: "1000",
  };
  ensureBuild(".next-test", env, () => {});
  app = await startAppServer({ mode: "start", port, env, quiet: true });
  const sql = postgres(url, { max: 1, onnotice: () => {} });
  const [ines] = await sql<{ id: string }[]>`select id from "user" where email = 'runner@northfold.test'`;
  const [test] = await sql<
    { id: string }[]
  >`select id from athlete_test where athlete_id = ${ines!.id} order by test_date desc limit 1`;
  await sql.end();

  const browser = await launchChromium();
  const signedIn = async (email: string) => {
    const page = await (await browser.newContext({ viewport: { width: 1440, height: 900 } })).newPage();
    await page.goto(`${origin}/sign-in`);
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill(DEMO_PASSWORD);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL((u) => !u.pathname.startsWith("/sign-in") && u.pathname !== "/home");
    return page;
  };
  /** Navigation until nothing is pending for 500 ms, measured to the last answer. */
  const settle = async (page: Page, path: string): Promise<number> => {
    let pending = 0;
    let last = performance.now();
    let t0 = performance.now();
    const log: string[] = [];
    const started = (r: import("playwright-core").Request) => {
      pending++;
      if (process.env.SETTLE_DEBUG)
        log.push(`${(performance.now() - t0).toFixed(0)} ${r.method()} ${r.url().slice(origin.length)}`);
    };
    const ended = () => {
      pending--;
      last = performance.now();
    };
    page.on("request", started);
    page.on("requestfinished", ended);
    page.on("requestfailed", ended);
    t0 = performance.now();
    await page.goto(`${origin}${path}`, { waitUntil: "load" });
    last = Math.max(last, performance.now());
    while (!(pending <= 0 && performance.now() - last >= 500)) await new Promise((r) => setTimeout(r, 25));
    page.off("request", started);
    page.off("requestfinished", ended);
    page.off("requestfailed", ended);
    if (process.env.SETTLE_DEBUG) console.log(path, (last - t0).toFixed(0), "\n  " + log.join("\n  "));
    return last - t0;
  };
  const median = async (page: Page, path: string) => {
    await settle(page, path); // warm: the first load compiles nothing in production, but fills caches as any later visit
    const times: number[] = [];
    for (let i = 0; i < LOADS; i++) times.push(await settle(page, path));
    times.sort((a, b) => a - b);
    return (times[4]! + times[5]!) / 2;
  };
  const coach = await signedIn("coach@northfold.test");
  const athlete = await signedIn("runner@northfold.test");
  const pages: [string, Page, string][] = [
    ["plan", coach, `/athletes/${ines!.id}/plan`],
    ["roster", coach, "/roster"],
    ["test", coach, `/tests/${test!.id}`],
    ["today", athlete, "/today"],
  ];
  const staticCoach = await median(coach, "/a-page-that-does-not-exist");
  const staticAthlete = await median(athlete, "/a-page-that-does-not-exist");
  console.log(
    `floor: a static page of the app (its "not found" page), median of ${LOADS} loads until nothing is pending = 1 (${staticCoach.toFixed(0)} ms signed in as a coach, ${staticAthlete.toFixed(0)} ms as an athlete)`,
  );
  for (const [name, page, path] of pages) {
    const t = await median(page, path);
    const ratio = t / (page === coach ? staticCoach : staticAthlete);
    console.log(
      `the ${name} page settles in ${ratio.toFixed(2)} × floor (target ≤ 2) ${ratio <= 2 ? "OK" : "ABOVE TARGET"} (${t.toFixed(0)} ms)`,
    );
  }
  await browser.close();
} finally {
  await app?.stop();
  await cluster.stop();
}
