/**
 * Part of `npm run bench` (run with the react-server condition): `GET /api/athletes/:id/weeks` for a whole season at 50
 * concurrent connections (autocannon on loopback), against a bare route handler that runs one query on the same pool.
 * Both are served by the same plain Node HTTP server calling the route handlers. Three rounds, each measuring the floor
 * and then the route, so that a slow moment of the machine hits both; prints each round's p95 ratio and their median
 * (target ≤ 2). The route answers a repeated question from its store of answers (week-cache.ts) while nothing changed;
 * the same run also measures it with that store emptied before every request, i.e. as after every change (no target).
 */
import http from "node:http";
import type { AddressInfo } from "node:net";
import autocannon from "autocannon";
import { applyMigrations } from "../db/migrate";
import { createDatabase, startThrowawayCluster } from "./postgres";

const CONNECTIONS = 50;
const SECONDS = 5;
const ROUNDS = 3;

async function p95(url: string, cookie: string): Promise<{ p95: number; requests: number; errors: number }> {
  const latencies: number[] = [];
  let errors = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url, connections: CONNECTIONS, duration: SECONDS, headers: { cookie } }, (err, r) =>
      err ? reject(err) : resolve(r),
    );
    instance.on("response", (_client, statusCode, _bytes, responseTime) => {
      if (statusCode !== 200) errors++;
      latencies.push(responseTime);
    });
  });
  latencies.sort((a, b) => a - b);
  return {
    p95: latencies[Math.floor(0.95 * (latencies.length - 1))] ?? NaN,
    requests: result.requests.total,
    errors: errors + result.errors + result.non2xx,
  };
}

const cluster = await startThrowawayCluster();
let server: http.Server | undefined;
try {
  await createDatabase(cluster, "tidemark_bench_weeks");
  const url = cluster.url("tidemark_bench_weeks");
  await applyMigrations(url);
  Object.assign(process.env, {
    DATABASE_URL: url,
    BETTER_AUTH_SECRET: "tidemark-bench-secret-0123456789-abcdefghij",
    BETTER_AUTH_URL: "http://127.0.0.1:3999",
    TIDEMARK_LOCAL_OUTBOX: "1",
  });
  const { Browser } = await import("../test/support/api");
  const squadsRoute = await import("../app/api/squads/route");
  const weeksRoute = await import("../app/api/athletes/[id]/weeks/route");
  const seasonsRoute = await import("../app/api/athletes/[id]/seasons/route");
  const sessionsRoute = await import("../app/api/athletes/[id]/sessions/route");
  const templatesRoute = await import("../app/api/templates/route");
  const { getDb, schema, closeDb } = await import("../db/client");
  const { sql } = await import("drizzle-orm");
  const { forgetAllAnswers } = await import("../features/planning/server/week-cache");

  // A head coach with a squad, an athlete in it (added directly: invitations are not what is measured), and a season of
  // 40 weeks with five sessions a week.
  // Accounts are confirmed directly (e-mails render with react-dom/server, which this react-server run cannot load).
  const confirmed = async (b: InstanceType<typeof Browser>, name: string, email: string) => {
    const user = await b.signUp(name, email, "correct-horse-battery", { verify: false });
    await getDb()
      .update(schema.user)
      .set({ emailVerified: true })
      .where(sql`${schema.user.email} = ${email}`);
    const r = await b.signIn(email);
    if (r.status !== 200) throw new Error(`sign-in: ${r.status}`);
    return user;
  };
  const coach = new Browser();
  await confirmed(coach, "Bench coach", "coach@bench.test");
  const squad = await coach.call(squadsRoute, "POST", "/api/squads", { body: { name: "Bench squad" } });
  const athleteId = (await confirmed(new Browser("198.51.100.2"), "Bench athlete", "athlete@bench.test")).id;
  await getDb().insert(schema.membership).values({ squadId: squad.json.id, userId: athleteId, role: "athlete" });
  const s = { squadId: squad.json.id as string, coach: { browser: coach } };
  const season = await s.coach.browser.call(seasonsRoute, "POST", `/api/athletes/${athleteId}/seasons`, {
    params: { id: athleteId },
    body: {
      name: "Bench season",
      sport: "running",
      startDate: "2027-01-04",
      events: [{ date: "2027-10-03", name: "Race" }],
      weeklyHours: 8,
    },
  });
  if (season.status !== 201) throw new Error(`season: ${season.status}`);
  const weeks = season.json.weeks as { weekStart: string }[];
  const step = (kind: string, min: number, zone: number) => ({ type: "step", kind, durationS: min * 60, zone });
  const template = await s.coach.browser.call(templatesRoute, "POST", "/api/templates", {
    body: {
      squadId: s.squadId,
      name: "4 × 5 min",
      sport: "running",
      structure: [
        step("warmup", 15, 1),
        { type: "repeat", times: 4, steps: [step("work", 5, 3), step("recovery", 3, 1)] },
        step("cooldown", 10, 1),
      ],
    },
  });
  const planned = await s.coach.browser.call(sessionsRoute, "POST", `/api/athletes/${athleteId}/sessions`, {
    params: { id: athleteId },
    body: {
      date: weeks[0]!.weekStart,
      templateId: template.json.id,
      repeat: { byWeekday: ["MO", "TU", "TH", "FR", "SA"], count: 104 },
    },
  });
  if (planned.status !== 201) throw new Error(`sessions: ${planned.status}`);
  const from = weeks[0]!.weekStart,
    to = weeks[weeks.length - 1]!.weekStart;

  const db = getDb();
  let inFlight = 0;
  server = http.createServer((req, res) => {
    inFlight++;
    void (async () => {
      const u = new URL(req.url ?? "/", "http://127.0.0.1");
      let response: Response;
      if (u.pathname.startsWith("/cold/")) {
        // As after a change: nothing stored to answer from.
        forgetAllAnswers();
        u.pathname = u.pathname.slice("/cold".length);
      }
      if (u.pathname === "/bare") {
        // The floor: one query on the same pool, its rows as JSON.
        const rows = await db.execute(
          sql`select date, minutes_by_zone from planned_session where athlete_id = ${athleteId} and date between ${from} and ${to}`,
        );
        response = Response.json(rows);
      } else {
        const headers = new Headers();
        for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
        response = await weeksRoute.GET(new Request(`http://127.0.0.1:3999${u.pathname}${u.search}`, { headers }), {
          params: Promise.resolve({ id: athleteId }),
        });
      }
      res.writeHead(response.status, { "content-type": "application/json" });
      res.end(Buffer.from(await response.arrayBuffer()));
    })()
      .catch((e) => {
        res.writeHead(500);
        res.end(String(e));
      })
      .finally(() => inFlight--);
  });
  await new Promise<void>((r) => server!.listen(0, "127.0.0.1", r));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const cookie = s.coach.browser.cookie;
  const weeksPath = `/api/athletes/${athleteId}/weeks?from=${from}&to=${to}`;
  for (const path of ["/bare", weeksPath, `/cold${weeksPath}`]) await p95(`${base}${path}`, cookie); // warm-up of every path
  const warm: number[] = [];
  const cold: number[] = [];
  let requests = 0;
  for (let round = 0; round < ROUNDS; round++) {
    const floor = await p95(`${base}/bare`, cookie);
    const stored = await p95(`${base}${weeksPath}`, cookie);
    const computed = await p95(`${base}/cold${weeksPath}`, cookie);
    for (const r of [floor, stored, computed])
      if (r.errors) throw new Error(`${r.errors} errors during round ${round + 1}`);
    warm.push(stored.p95 / floor.p95);
    cold.push(computed.p95 / floor.p95);
    requests += stored.requests;
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
  const list = (xs: number[]) => xs.map((x) => x.toFixed(2)).join(", ");
  console.log(
    `floor: p95 of a bare handler running one query on the same pool, ${CONNECTIONS} connections for ${SECONDS} s, measured in each of ${ROUNDS} rounds of this run = 1`,
  );
  console.log(
    `GET /api/athletes/:id/weeks for a ${weeks.length}-week season: p95 ${median(warm).toFixed(2)} × floor (median of ${list(warm)}; ${requests} requests, target ≤ 2) ${median(warm) <= 2 ? "OK" : "ABOVE TARGET"}`,
  );
  console.log(
    `  the same, computed afresh for every request (as after each change): p95 ${median(cold).toFixed(2)} × floor (median of ${list(cold)}; no target)`,
  );
  // Requests still running when a run's time was up finish before the pool closes.
  server.close();
  server.closeAllConnections();
  while (inFlight > 0) await new Promise((r) => setTimeout(r, 20));
  server = undefined;
  await closeDb();
} finally {
  server?.close();
  await cluster.stop();
}
