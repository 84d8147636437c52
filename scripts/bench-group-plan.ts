/**
 * Part of `npm run bench` (run by it with the react-server condition, so that server modules load outside Next): one
 * squad-wide action, a week of 7 sessions copied to 30 athletes (210 sessions, one transaction), against the same rows
 * written by one bare insert, measured in the same run (target ≤ 3); and per session against planning one session alone.
 */
import { randomUUID } from "node:crypto";
import { applyMigrations } from "../db/migrate";
import { createDatabase, startThrowawayCluster } from "./postgres";

const ATHLETES = 30;

async function timeAsync(fn: () => Promise<unknown>, runs: number, between?: () => Promise<unknown>): Promise<number> {
  for (let i = 0; i < 2; i++) {
    await fn();
    await between?.();
  }
  let total = 0;
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    await fn();
    total += performance.now() - start;
    await between?.();
  }
  return total / runs;
}

const cluster = await startThrowawayCluster();
try {
  await createDatabase(cluster, "tidemark_bench_group");
  const url = cluster.url("tidemark_bench_group");
  await applyMigrations(url);
  process.env.DATABASE_URL = url;
  const { getDb, schema, closeDb } = await import("../db/client");
  const { planForSquad, createSession } = await import("../features/planning/server");
  const { sql } = await import("drizzle-orm");
  const db = getDb();
  const squadId = randomUUID(),
    coachId = randomUUID();
  await db.insert(schema.squad).values({ id: squadId, name: "Bench squad" });
  await db.insert(schema.user).values({ id: coachId, name: "Bench coach", email: "coach@bench.test" });
  await db.insert(schema.membership).values({ squadId, userId: coachId, role: "head_coach" });
  const athletes: string[] = [];
  for (let a = 0; a < ATHLETES; a++) {
    const id = randomUUID();
    athletes.push(id);
    await db.insert(schema.user).values({ id, name: `Athlete ${a}`, email: `a${a}@bench.test` });
    await db.insert(schema.membership).values({ squadId, userId: id, role: "athlete" });
    await db.insert(schema.athleteProfile).values({ userId: id, sports: ["running"], timeZone: "Europe/Berlin" });
  }
  const structure = [
    { type: "step", kind: "warmup", durationS: 900, zone: 1 },
    { type: "repeat", times: 5, steps: [{ type: "step", kind: "work", durationS: 240, zone: 3 }] },
    { type: "step", kind: "cooldown", durationS: 600, zone: 1 },
  ];
  const templateId = randomUUID();
  await db.insert(schema.sessionTemplate).values({
    id: templateId,
    squadId,
    name: "Intervals",
    sport: "running",
    structure,
    totalS: 2700,
    minutesByZone: [25, 0, 20],
    createdBy: coachId,
  });
  const actor = { userId: coachId, isAdmin: false, memberships: [{ squadId, role: "head_coach" as const }] };
  // The source week: seven sessions of the first athlete in the week of 2030-03-04.
  for (let d = 0; d < 7; d++)
    await createSession(actor, athletes[0]!, { date: `2030-03-${String(4 + d).padStart(2, "0")}`, templateId });
  const targets = athletes.slice(1).concat(athletes[0]!);
  const clear = () => db.execute(sql`delete from planned_session where date >= '2030-03-11'`);
  const single = await timeAsync(
    () => createSession(actor, athletes[1]!, { date: "2030-03-12", templateId }),
    30,
    clear,
  );
  const group = await timeAsync(
    async () => {
      const a = await planForSquad(actor, squadId, {
        mode: "week",
        sourceAthleteId: athletes[0]!,
        sourceWeek: "2030-03-04",
        targetWeeks: ["2030-03-11"],
        athleteIds: targets,
        preview: false,
      });
      if (a.created !== ATHLETES * 7) throw new Error(`created ${a.created}`);
    },
    10,
    clear,
  );
  // The floor: the same 210 rows written by one bare insert in one transaction (the database's own cost, triggers included).
  const rows = targets.flatMap((athleteId) =>
    Array.from({ length: 7 }, (_, d) => ({
      id: randomUUID(),
      athleteId,
      date: `2030-03-${String(11 + d).padStart(2, "0")}`,
      title: "Intervals",
      sport: "running",
      structure,
      totalS: 2700,
      minutesByZone: [25, 0, 20] as [number, number, number],
      templateId,
      createdBy: coachId,
    })),
  );
  const bare = await timeAsync(
    () =>
      db.transaction((tx) => tx.insert(schema.plannedSession).values(rows.map((r) => ({ ...r, id: randomUUID() })))),
    10,
    clear,
  );
  console.log(
    `floor: the same ${ATHLETES * 7} sessions written by one bare insert in one transaction, measured in this run = 1`,
  );
  console.log(
    `a week of 7 sessions copied to ${ATHLETES} athletes in one action (access checks, each athlete's week before and after, one insert): ${(group / bare).toFixed(3)} × floor (target ≤ 3) ${group / bare <= 3 ? "OK" : "ABOVE TARGET"}`,
  );
  console.log(
    `  per session planned, the action costs ${(group / (ATHLETES * 7) / single).toFixed(3)} × planning one session on its own (${(group / single).toFixed(1)} × for the whole action)`,
  );
  await closeDb();
} finally {
  await cluster.stop();
}
