/**
 * `npm run soak`: 100 simulated athletes logging sessions and 10 coaches moving sessions for 60 s on loopback, against the
 * production build on its own PostgreSQL; reports requests, errors, p50/p95 and checks that every acknowledged write is
 * in the database. Then it measures a floor in the same run: a bare one-insert handler (POST /api/soak-floor) at the same
 * concurrency; it prints the logs' and the moves' p95 against it (target ≤ 3). `-- --restart-db` restarts PostgreSQL
 * during the load and reports the 503 answers while it is down and how long the app took to recover. `-- --seconds N`
 * changes the duration. Not part of `npm test`.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import postgres from "postgres";
import { applyMigrations } from "../db/migrate";
import { startAppServer, type AppServer } from "./app-server";
import { ensureBuild } from "./build";
import { createDatabase, freePort, startCluster, type Cluster } from "./postgres";

const args = process.argv.slice(2);
const SECONDS =
  Number(args[args.indexOf("--seconds") + 1]) > 0 && args.includes("--seconds")
    ? Number(args[args.indexOf("--seconds") + 1])
    : 60;
const RESTART = args.includes("--restart-db");
const ATHLETES = 100,
  COACHES = 10,
  SESSIONS_PER_ATHLETE = 400;

const pct = (xs: number[], p: number) =>
  xs.length ? [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))]! : NaN;
const log = (l: string) => console.log(`[soak] ${l}`);

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), "tidemark-soak-"));
fs.chmodSync(dataDir, 0o700);
const pgPort = await freePort();
let cluster: Cluster | undefined = await startCluster({ dataDir, port: pgPort, log: () => {} });
let app: AppServer | undefined;
try {
  await createDatabase(cluster, "tidemark_soak");
  const url = cluster.url("tidemark_soak");
  await applyMigrations(url);
  const port = await freePort();
  const origin = `http://127.0.0.1:${port}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
    DATABASE_URL: url,
    BETTER_AUTH_URL: origin,
    BETTER_AUTH_SECRET: "tidemark-soak-secret-0123456789-abcdefghij",
    TIDEMARK_DIST_DIR: ".next-test",
    TIDEMARK_LOCAL_OUTBOX: "1",
    TIDEMARK_SIGN_IN_LIMIT_PER_MIN: "100000",
    DATABASE_POOL_SIZE: "20",
    TIDEMARK_SOAK_FLOOR: "1",
  };
  ensureBuild(".next-test", env, log);
  app = await startAppServer({ mode: "start", port, env, quiet: true });

  // People: sign-ups through the app (each from its own address, as in life), squads through the API, memberships and
  // planned sessions written directly (they are not what is measured).
  const sql = postgres(url, { max: 2, onnotice: () => {} });
  // Sign-up asks for a confirmed address before the first sign-in: the soak confirms it in the database, then signs in.
  const signUp = async (name: string, email: string, i: number) => {
    const headers = { "content-type": "application/json", origin, "x-forwarded-for": `10.1.${i >> 8}.${i & 255}` };
    const r = await fetch(`${origin}/api/auth/sign-up/email`, {
      method: "POST",
      headers,
      body: JSON.stringify({ name, email, password: "soak-password-123" }),
    });
    if (!r.ok) throw new Error(`sign-up ${email}: ${r.status} ${await r.text()}`);
    const user = ((await r.json()) as { user: { id: string } }).user;
    await sql`update "user" set email_verified = true where id = ${user.id}`;
    const signIn = await fetch(`${origin}/api/auth/sign-in/email`, {
      method: "POST",
      headers,
      body: JSON.stringify({ email, password: "soak-password-123" }),
    });
    if (!signIn.ok) throw new Error(`sign-in ${email}: ${signIn.status} ${await signIn.text()}`);
    return {
      id: user.id,
      cookie: signIn.headers
        .getSetCookie()
        .map((c) => c.split(";")[0])
        .join("; "),
    };
  };
  const coaches: { id: string; cookie: string; squadId: string }[] = [];
  for (let c = 0; c < COACHES; c++) {
    const u = await signUp(`Coach ${c}`, `coach${c}@soak.test`, c);
    const sq = await fetch(`${origin}/api/squads`, {
      method: "POST",
      headers: { "content-type": "application/json", origin, cookie: u.cookie },
      body: JSON.stringify({ name: `Squad ${c}` }),
    });
    if (sq.status !== 201) throw new Error(`squad for coach ${c}: ${sq.status} ${await sq.text()}`);
    coaches.push({ ...u, squadId: ((await sq.json()) as { id: string }).id });
  }
  const athletes: { id: string; cookie: string; coach: (typeof coaches)[number]; sessions: string[] }[] = [];
  for (let a = 0; a < ATHLETES; a++) {
    const u = await signUp(`Athlete ${a}`, `athlete${a}@soak.test`, 100 + a);
    const coach = coaches[a % COACHES]!;
    await sql`insert into membership (squad_id, user_id, role) values (${coach.squadId}, ${u.id}, 'athlete')`;
    await sql`insert into planned_session (id, athlete_id, date, sport, title, kind, structure, total_s, minutes_by_zone, created_by)
      select gen_random_uuid()::text, ${u.id}, to_char(date '2027-01-01' + (g % 365), 'YYYY-MM-DD'), 'running', 'Soak run ' || g, 'training',
        '[{"type":"step","kind":"work","durationS":2700,"zone":1}]'::jsonb, 2700, '[45,0,0]'::jsonb, ${coach.id}
      from generate_series(1, ${SESSIONS_PER_ATHLETE}) g`;
    athletes.push({
      ...u,
      coach,
      sessions: (
        await sql<{ id: string }[]>`select id from planned_session where athlete_id = ${u.id} order by date, id`
      ).map((r) => r.id),
    });
  }
  log(
    `${COACHES} coaches, ${ATHLETES} athletes, ${ATHLETES * SESSIONS_PER_ATHLETE} planned sessions; load for ${SECONDS} s${RESTART ? ", restarting PostgreSQL at 20 s" : ""}…`,
  );

  const latency = { log: [] as number[], move: [] as number[] };
  const status: Record<string, number> = {};
  const acknowledgedLogs = new Set<string>();
  const acknowledgedMoves = new Map<string, string>();
  let networkErrors = 0,
    unavailable = 0,
    unavailableWithRetryAfter = 0;
  let down: { at: number; upAt: number | null; firstSuccessAfterUp: number | null } | null = null;
  const end = Date.now() + SECONDS * 1000;
  const call = async (kind: "log" | "move", input: string, init: RequestInit) => {
    const t = performance.now();
    try {
      const r = await fetch(input, init);
      const ms = performance.now() - t;
      status[r.status] = (status[r.status] ?? 0) + 1;
      if (r.status === 503) {
        unavailable++;
        if (r.headers.get("retry-after")) unavailableWithRetryAfter++;
      } else latency[kind].push(ms);
      if (r.ok && down?.upAt && down.firstSuccessAfterUp === null) down.firstSuccessAfterUp = Date.now();
      await r.arrayBuffer();
      return r.status;
    } catch {
      networkErrors++;
      return 0;
    }
  };
  const athleteLoop = async (a: (typeof athletes)[number]) => {
    let next = 0;
    while (Date.now() < end && next < a.sessions.length) {
      const id = a.sessions[next]!;
      const s = await call("log", `${origin}/api/sessions/${id}/log`, {
        method: "POST",
        headers: { "content-type": "application/json", origin, cookie: a.cookie },
        body: JSON.stringify({ status: "done", durationMin: 40 + (next % 10), rpe: 3 + (next % 5) }),
      });
      if (s === 201 || s === 200) {
        acknowledgedLogs.add(id);
        next++;
      } else if (s === 409)
        next++; // already logged by an earlier, unacknowledged attempt
      else await new Promise((r) => setTimeout(r, 200));
    }
  };
  const coachLoop = async (c: (typeof coaches)[number], k: number) => {
    const own = athletes.filter((a) => a.coach === c).flatMap((a) => a.sessions.slice(-100));
    let i = 0;
    while (Date.now() < end) {
      const id = own[(i * 7 + k) % own.length]!;
      const date = `2028-0${1 + (i % 9)}-${String(1 + (i % 27)).padStart(2, "0")}`;
      const s = await call("move", `${origin}/api/sessions/${id}`, {
        method: "PATCH",
        headers: { "content-type": "application/json", origin, cookie: c.cookie },
        body: JSON.stringify({ date }),
      });
      if (s === 200) acknowledgedMoves.set(id, date);
      else if (s !== 0) await new Promise((r) => setTimeout(r, 200));
      i++;
    }
  };
  const restart = RESTART
    ? (async () => {
        await new Promise((r) => setTimeout(r, 20_000));
        log("Stopping PostgreSQL…");
        down = { at: Date.now(), upAt: null, firstSuccessAfterUp: null };
        await cluster!.stop();
        await new Promise((r) => setTimeout(r, 5_000));
        cluster = await startCluster({ dataDir, port: pgPort, log: () => {} });
        down.upAt = Date.now();
        log("PostgreSQL is back.");
      })()
    : Promise.resolve();
  const started = Date.now();
  await Promise.all([...athletes.map(athleteLoop), ...coaches.map(coachLoop), restart]);
  const elapsed = (Date.now() - started) / 1000;

  // The floor: the same number of clients, each POSTing one after another to a bare handler that does one insert in one
  // transaction on the same pool (POST /api/soak-floor), for a third of the load's time (at least 15 s).
  const floorLatency: number[] = [];
  let floorErrors = 0;
  if (!RESTART) {
    const floorEnd = Date.now() + Math.max(15, SECONDS / 3) * 1000;
    await Promise.all(
      Array.from({ length: ATHLETES + COACHES }, async () => {
        while (Date.now() < floorEnd) {
          const t = performance.now();
          try {
            const r = await fetch(`${origin}/api/soak-floor`, { method: "POST", headers: { origin } });
            await r.arrayBuffer();
            if (r.status === 201) floorLatency.push(performance.now() - t);
            else floorErrors++;
          } catch {
            floorErrors++;
          }
        }
      }),
    );
  }
  const check = postgres(cluster.url("tidemark_soak"), { max: 1, onnotice: () => {} });
  const n = (await check<{ n: number }[]>`select count(*)::int as n from session_log`)[0]!.n;
  const logged = new Set(
    (await check<{ id: string }[]>`select planned_session_id as id from session_log`).map((r) => r.id),
  );
  const lostLogs = [...acknowledgedLogs].filter((id) => !logged.has(id)).length;
  const moved = await check<
    { id: string; date: string }[]
  >`select id, date from planned_session where id in ${check([...acknowledgedMoves.keys()])}`;
  const lostMoves = moved.filter((m) => acknowledgedMoves.get(m.id) !== m.date).length;
  await check.end();
  await sql.end({ timeout: 1 }).catch(() => undefined);
  const total = Object.values(status).reduce((a, b) => a + b, 0) + networkErrors;
  const errors =
    Object.entries(status)
      .filter(([k]) => Number(k) >= 500 && Number(k) !== 503)
      .reduce((a, [, v]) => a + v, 0) + networkErrors;
  console.log("");
  log(
    `requests: ${total} in ${elapsed.toFixed(0)} s (${(total / elapsed).toFixed(0)}/s); answers ${JSON.stringify(status)}; network errors ${networkErrors}`,
  );
  log(
    `session logs (POST /api/sessions/:id/log): ${latency.log.length} answered, p50 ${pct(latency.log, 0.5).toFixed(0)} ms, p95 ${pct(latency.log, 0.95).toFixed(0)} ms`,
  );
  log(
    `session moves (PATCH /api/sessions/:id): ${latency.move.length} answered, p50 ${pct(latency.move, 0.5).toFixed(0)} ms, p95 ${pct(latency.move, 0.95).toFixed(0)} ms`,
  );
  log(`errors (5xx other than 503, or no answer): ${errors}`);
  if (floorLatency.length) {
    const f95 = pct(floorLatency, 0.95);
    const ratio = (xs: number[]) => pct(xs, 0.95) / f95;
    log(
      `floor (POST /api/soak-floor: one insert in one transaction, ${ATHLETES + COACHES} clients): ${floorLatency.length} answered, p50 ${pct(floorLatency, 0.5).toFixed(0)} ms, p95 ${f95.toFixed(0)} ms, ${floorErrors} errors`,
    );
    log(
      `p95 against the floor (target ≤ 3): logs ${ratio(latency.log).toFixed(2)} × ${ratio(latency.log) <= 3 ? "OK" : "ABOVE TARGET"}, moves ${ratio(latency.move).toFixed(2)} × ${ratio(latency.move) <= 3 ? "OK" : "ABOVE TARGET"}`,
    );
  }
  log(
    `acknowledged writes: ${acknowledgedLogs.size} logs (database holds ${n}, missing ${lostLogs}), ${acknowledgedMoves.size} sessions moved (missing or different ${lostMoves})`,
  );
  const d = down as { at: number; upAt: number | null; firstSuccessAfterUp: number | null } | null;
  if (d) {
    log(
      `database restart: ${unavailable} answers 503 while it was down (${unavailableWithRetryAfter} with Retry-After); first success ${d.firstSuccessAfterUp && d.upAt ? `${((d.firstSuccessAfterUp - d.upAt) / 1000).toFixed(1)} s` : "never"} after it was back`,
    );
  }
  process.exitCode = lostLogs || lostMoves || (!RESTART && errors) ? 1 : 0;
} finally {
  await app?.stop();
  await cluster?.stop().catch(() => undefined);
  fs.rmSync(dataDir, { recursive: true, force: true });
}
