/**
 * Part of `npm run bench` (run by it with the react-server condition, so that server modules load outside Next): the roster
 * of a squad of 300 athletes, each with zones, a test, five weeks of plan and logs, against one aggregate query that reads
 * the same rows. Prints the ratio measured in this run (target ≤ 3), and the cost when every cached row must be computed.
 */
import { randomUUID } from "node:crypto";
import { applyMigrations } from "../db/migrate";
import { createDatabase, startThrowawayCluster } from "./postgres";

const ATHLETES = 300;

function timeAsync(fn: () => Promise<unknown>, runs: number): Promise<number> {
  return (async () => {
    for (let i = 0; i < 2; i++) await fn();
    const start = performance.now();
    for (let i = 0; i < runs; i++) await fn();
    return (performance.now() - start) / runs;
  })();
}

const cluster = await startThrowawayCluster();
try {
  await createDatabase(cluster, "tidemark_bench");
  const url = cluster.url("tidemark_bench");
  await applyMigrations(url);
  process.env.DATABASE_URL = url;
  const { getDb, schema, closeDb } = await import("../db/client");
  const { squadRoster } = await import("../features/roster/server/roster");
  const { sql } = await import("drizzle-orm");
  const db = getDb();
  const now = new Date();
  const today = now.toISOString().slice(0, 10);
  const plus = (n: number) => new Date(Date.parse(`${today}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);
  const squadId = randomUUID(),
    coachId = randomUUID();
  await db.insert(schema.squad).values({ id: squadId, name: "Bench squad" });
  await db.insert(schema.user).values({ id: coachId, name: "Bench coach", email: "coach@bench.test" });
  await db.insert(schema.membership).values({ squadId, userId: coachId, role: "head_coach" });
  for (let a = 0; a < ATHLETES; a++) {
    const id = randomUUID();
    await db
      .insert(schema.user)
      .values({ id, name: `Athlete ${String(a).padStart(3, "0")}`, email: `a${a}@bench.test` });
    await db.insert(schema.membership).values({ squadId, userId: id, role: "athlete" });
    await db.insert(schema.athleteProfile).values({ userId: id, sports: ["cycling"], timeZone: "Europe/Berlin" });
    const testId = randomUUID();
    await db.insert(schema.athleteTest).values({
      id: testId,
      athleteId: id,
      kind: "manual",
      sport: "cycling",
      testDate: plus(-60 - (a % 50)),
      protocol: "bench",
      endedBy: "plan",
      input: {},
      result: {},
      detected: { vt1: { hrBpm: 140, powerW: 200 }, vt2: { hrBpm: 165, powerW: 280 } },
      createdBy: coachId,
    });
    await db.insert(schema.zoneSet).values({
      id: randomUUID(),
      athleteId: id,
      sport: "cycling",
      testId,
      effectiveFrom: plus(-60 - (a % 50)),
      vt1: { hrBpm: 140, powerW: 200 },
      vt2: { hrBpm: 165, powerW: 280 },
      source: "manual",
    });
    const sessions = Array.from({ length: 35 }, (_, d) => d)
      .filter((d) => d % 7 !== 0 && d % 7 !== 4)
      .map((d) => ({
        id: randomUUID(),
        athleteId: id,
        date: plus(d - 28),
        sport: "cycling",
        title: "Ride",
        structure: [],
        totalS: 3600,
        minutesByZone: [48, 4, 8] as [number, number, number],
        createdBy: coachId,
      }));
    await db.insert(schema.plannedSession).values(sessions);
    const logs = sessions
      .filter((s) => s.date < today)
      .map((s, k) => ({
        id: randomUUID(),
        athleteId: id,
        plannedSessionId: s.id,
        date: s.date,
        sport: "cycling",
        title: s.title,
        status: "done" as const,
        durationMin: 55 + (k % 10),
        rpe: 3 + (k % 5),
        hrAvgBpm: 130 + (k % 9),
        powerAvgW: 180 + (k % 13),
        loggedBy: id,
      }));
    await db.insert(schema.sessionLog).values(logs);
  }
  const actor = { userId: coachId, isAdmin: false, memberships: [{ squadId, role: "head_coach" as const }] };
  const check = await squadRoster(actor, squadId, now);
  if (check.rows.length !== ATHLETES) throw new Error(`roster has ${check.rows.length} rows`);
  // The floor: one query over the same tables and date ranges, aggregated per athlete in the database.
  const aggregate = () =>
    db.execute(sql`
      select m.user_id,
        (select max(effective_from) from zone_set z where z.athlete_id = m.user_id) as zones_from,
        (select max(test_date) from athlete_test t where t.athlete_id = m.user_id) as last_test,
        (select count(*) from planned_session p where p.athlete_id = m.user_id and p.date between ${plus(-35)} and ${plus(6)}) as planned,
        (select coalesce(sum(p.total_s), 0) from planned_session p where p.athlete_id = m.user_id and p.date between ${plus(-35)} and ${plus(6)}) as planned_s,
        (select coalesce(sum(l.duration_min * l.rpe), 0) from session_log l where l.athlete_id = m.user_id and l.date between ${plus(-120)} and ${plus(6)}) as load,
        (select coalesce(sum(l.duration_min), 0) from session_log l where l.athlete_id = m.user_id and l.date between ${plus(-120)} and ${plus(6)}) as done_min
      from membership m where m.squad_id = ${squadId} and m.role = 'athlete'`);
  const floor = await timeAsync(aggregate, 20);
  const roster = await timeAsync(() => squadRoster(actor, squadId, now), 20);
  // The first load of a day (or after every athlete changed): every row computed again and stored.
  const cold = await timeAsync(async () => {
    await db.execute(sql`update roster_cache set generation = generation + 1`);
    await squadRoster(actor, squadId, now);
  }, 10);
  console.log(`floor: one aggregate query over the rows of a ${ATHLETES}-athlete roster, measured in this run = 1`);
  console.log(
    `the roster for ${ATHLETES} athletes (zones, retests, budget, compliance, load, drift): ${(roster / floor).toFixed(3)} × floor (target ≤ 3) ${roster / floor <= 3 ? "OK" : "ABOVE TARGET"}`,
  );
  console.log(
    `  the same with every row computed afresh (first load of a day, or all athletes changed): ${(cold / floor).toFixed(3)} × floor`,
  );
  await closeDb();
} finally {
  await cluster.stop();
}
