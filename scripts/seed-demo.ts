/**
 * Writes the Northfold Endurance demo (scripts/demo-data.ts; all invented) into an empty database through the features'
 * server functions, so that demo data passes the same validation, rounding and rules as real data: the squad, profiles,
 * readiness screenings, tests (the gas-exchange files are uploaded as files), zone sets, templates, seasons (with their
 * retest sessions), planned sessions, logs and activity files. Only the accounts themselves are written directly, into the
 * auth library's tables (a demo account is confirmed without an e-mail round trip).
 *
 * Runs as its own process with the "server-only" hook (`seedDemoIfEmpty` in scripts/demo.ts starts it):
 *   DATABASE_URL=… node --import tsx --import ./scripts/register-server.mjs scripts/seed-demo.ts
 * Prints "seeded" or "not empty". When a step fails, the rows written so far are removed again (the database was empty
 * before), so the next start tries afresh.
 */
import { randomUUID } from "node:crypto";
import { sql } from "drizzle-orm";
import { hashPassword } from "better-auth/crypto";
import { closeDb, getDb, schema } from "../db/client";
import { actorForUser } from "../features/access/server/permissions";
import { importActivity } from "../features/activities/server/import";
import { encodeFit, type FitSecond } from "../features/activities/lib/fit-fixture";
import { SCREENING_QUESTIONS } from "../features/athlete-tests/lib/readiness";
import { jsonTestSchema, screeningSchema, testMetaSchema } from "../features/athlete-tests/schemas";
import { saveScreening } from "../features/athlete-tests/server/screening";
import { createGasExchangeTest, createJsonTest } from "../features/athlete-tests/server/tests";
import { updateAthleteProfile } from "../features/athletes/server/profile";
import { mulberry32, syntheticRamp } from "../features/gas-exchange/lib/synthetic-ramp";
import { logSchema, unplannedLogSchema } from "../features/logs/schemas";
import { logPlannedSession, logUnplannedSession, updateLog } from "../features/logs/server/logs";
import { flatten, type Block } from "../features/planning/lib/session";
import { createSessionSchema, seasonSchema, templateSchema } from "../features/planning/schemas";
import { createSeason } from "../features/planning/server/seasons";
import { createSession, listSessions } from "../features/planning/server/sessions";
import { createTemplate } from "../features/planning/server/templates";
import { localDate } from "../features/platform/lib/dates";
import { addDays, mondayOf } from "../features/platform/lib/days";
import { createSquad } from "../features/squads/server/squads";
import { getZones } from "../features/zones/server/zone-sets";
import {
  DEMO_ADMIN,
  DEMO_PASSWORD,
  DEMO_PEOPLE,
  DEMO_SQUAD_NAME,
  DEMO_TEMPLATES,
  FIT_SPORT,
  SEASON_SPORT,
  st,
  WEEK_PATTERN,
  type DemoPerson,
  type DemoTest,
} from "./demo-data";

const utcToday = () => new Date().toISOString().slice(0, 10);
const daysAgo = (n: number) => addDays(utcToday(), -n);

/** A demo account, confirmed (the auth library's own tables; the app never writes these otherwise). */
async function account(name: string, email: string, passwordHash: string, isAdmin = false): Promise<string> {
  const userId = randomUUID();
  const db = getDb();
  await db.insert(schema.user).values({ id: userId, name, email, emailVerified: true, isAdmin });
  await db
    .insert(schema.account)
    .values({ id: randomUUID(), accountId: userId, providerId: "credential", userId, password: passwordHash });
  return userId;
}

async function seedTest(coachId: string, athleteId: string, massKg: number | null, t: DemoTest) {
  const coach = await actorForUser(coachId);
  const meta = testMetaSchema.parse({
    sport: t.sport,
    protocol: t.protocol,
    date: daysAgo(t.daysAgo),
    endedBy: t.kind === "gas" ? "exhaustion" : "plan",
  });
  if (t.kind === "gas") {
    const bytes = new TextEncoder().encode(syntheticRamp(t.ramp).csv);
    await createGasExchangeTest(
      coach,
      athleteId,
      { ...meta, bodyMassKg: massKg },
      { name: `northfold-${t.sport}-${meta.date}.csv`, type: "text/csv", bytes },
    );
  } else {
    await createJsonTest(coach, athleteId, jsonTestSchema.parse({ kind: "talk", meta, talk: t.talk }));
  }
}

async function seedPlans(squadId: string, coachId: string, people: Map<string, string>) {
  const coach = await actorForUser(coachId);
  const templateIds = new Map<string, string>();
  for (const t of DEMO_TEMPLATES) {
    const row = await createTemplate(
      coach,
      templateSchema.parse({
        squadId,
        name: t.name,
        sport: t.sport,
        description: t.description,
        structure: t.structure,
      }),
    );
    templateIds.set(t.key, row.id);
  }
  const monday = mondayOf(utcToday());
  const year = Number(monday.slice(0, 4)) + (Number(monday.slice(5, 7)) >= 9 ? 1 : 0);
  for (const [email, pattern] of Object.entries(WEEK_PATTERN)) {
    const athleteId = people.get(email)!;
    const beginner = email.startsWith("walker");
    const event = { date: `${year}-10-03`, name: "Autumn goal event" };
    await createSeason(
      coach,
      athleteId,
      seasonSchema.parse({
        name: `Toward the autumn goal event ${year}`,
        sport: SEASON_SPORT[email]!,
        startDate: addDays(monday, -42),
        events: [event],
        weeklyHours: beginner ? 3 : 7,
        level: beginner ? "beginner" : "trained",
        retestEveryWeeks: 12,
      }),
    );
    const profile = DEMO_PEOPLE.find((p) => p.email === email)!.profile!;
    const today = localDate(new Date(), profile.timeZone);
    // Two weeks back, this week and next week.
    for (const weekOffset of [-14, -7, 0, 7]) {
      for (let d = 0; d < 7; d++) {
        const date = addDays(monday, weekOffset + d);
        let key = pattern[d];
        // Every athlete has something planned today (in their own time zone), so that "today" is never empty in the demo.
        if (!key && date === today)
          key = pattern.find((k) => k && DEMO_TEMPLATES.find((t) => t.key === k)!.structure.length === 1) ?? null;
        // The cyclist's current week carries two interval sessions too many: the demo's over-budget week.
        if (email.startsWith("cyclist") && weekOffset === 0 && (d === 4 || d === 6)) key = "bike-threshold";
        if (!key) continue;
        await createSession(coach, athleteId, createSessionSchema.parse({ date, templateId: templateIds.get(key)! }));
      }
    }
    // The skier's retest is due within the next seven days.
    if (email.startsWith("skier")) {
      const retest: Block[] = [st("warmup", 10, 1), st("work", 15, 2), st("cooldown", 10, 1)];
      await createSession(
        coach,
        athleteId,
        createSessionSchema.parse({
          date: addDays(utcToday(), 4),
          kind: "retest",
          sport: "running",
          title: "Retest: threshold test",
          structure: retest,
          notes: "Twelve weeks since the last talk test. Answer the readiness questions first.",
        }),
      );
    }
  }
}

/** An invented recording at steady values with a little noise (for the logs that carry a file). */
function recording(date: string, hour: number, sport: string, seconds: FitSecond[]) {
  return encodeFit({
    start: new Date(`${date}T${String(hour).padStart(2, "0")}:00:00Z`),
    sport: FIT_SPORT[sport] ?? "running",
    seconds,
  });
}

/**
 * Demo logs: the past planned sessions logged (a few partly done or skipped), each endurance athlete's latest past
 * session with an invented FIT file that follows its steps, and nine earlier weeks of logged sessions for the load chart —
 * the cyclist's as recordings whose heart rate at the same power creeps up in the last three weeks (the demo's zone drift).
 */
async function seedLogs(person: DemoPerson, athleteId: string) {
  const random = mulberry32(20261201 + DEMO_PEOPLE.indexOf(person));
  const athlete = await actorForUser(athleteId);
  const profile = person.profile!;
  const today = localDate(new Date(), profile.timeZone);
  const zones = await getZones(athlete, athleteId, today);
  const past = (await listSessions(athlete, athleteId, addDays(today, -60), addDays(today, -1))).sort((a, b) =>
    a.date < b.date ? -1 : 1,
  );
  const bike = person.email.startsWith("cyclist") ? zones.inForce.cycling : undefined;
  /** The cyclist's ride: power around VT1, heart rate on the line through the thresholds, seven beats higher once drifted. */
  const ride = (minutes: number, k: number, drifted: boolean): FitSecond[] | null => {
    if (!bike?.vt1.powerW || !bike.vt1.hrBpm || !bike.vt2.powerW || !bike.vt2.hrBpm) return null;
    const power = Math.round(bike.vt1.powerW * (0.8 + 0.05 * k));
    const slope = (bike.vt2.hrBpm - bike.vt1.hrBpm) / (bike.vt2.powerW - bike.vt1.powerW);
    const hr = Math.round(bike.vt1.hrBpm + slope * (power - bike.vt1.powerW)) + (drifted ? 7 : 0);
    return Array.from({ length: Math.round(minutes * 60) }, () => ({
      hrBpm: Math.round(hr + (random() - 0.5) * 2),
      powerW: Math.max(0, Math.round(power + (random() - 0.5) * 6)),
      speedKmh: 30,
    }));
  };
  const withFile = past.filter((p) => p.kind === "training").at(-1)?.id;
  for (const p of past) {
    const r = random();
    const plannedMin = p.totalS / 60;
    const hard = p.minutesByZone[2] > 0 ? 2 : p.minutesByZone[1] > 0 ? 1 : 0;
    if (r < 0.07 && p.id !== withFile) {
      await logPlannedSession(athlete, p.id, logSchema.parse({ status: "skipped", skipReason: "Work ran late" }));
      continue;
    }
    const partial = r < 0.14 && p.id !== withFile;
    const durationMin = Math.round(plannedMin * (partial ? 0.6 : 0.95 + random() * 0.1));
    const rpe = [3, 5, 7][hard]! + (random() < 0.3 ? 1 : 0);
    await logPlannedSession(
      athlete,
      p.id,
      logSchema.parse({
        status: partial ? "partial" : "done",
        durationMin,
        rpe,
        notes: partial ? "Cut short: heavy legs." : "",
      }),
    );
    const sport = p.sport === "triathlon" ? "cycling" : p.sport;
    const set = zones.inForce[sport];
    let seconds: FitSecond[] | null = null;
    if (p.id === withFile && set) {
      // A recording that follows the planned steps: each zone at a value inside it.
      const at = (zone: number, key: "hrBpm" | "powerW" | "speedKmh") => {
        const v1 = set.vt1[key],
          v2 = set.vt2[key];
        if (v1 == null || v2 == null) return undefined;
        const v = zone === 1 ? v1 * 0.88 : zone === 2 ? (v1 + v2) / 2 : v2 * 1.04;
        return key === "speedKmh" ? v : Math.round(v);
      };
      seconds = [];
      for (const step of flatten(p.structure as Block[])) {
        const n = Math.round((step.durationS ?? 600) * (durationMin / plannedMin));
        for (let i = 0; i < n; i++) {
          const noise = (random() - 0.5) * 4;
          const hr = at(step.zone, "hrBpm"),
            pw = at(step.zone, "powerW"),
            sp = at(step.zone, "speedKmh");
          seconds.push({
            ...(hr !== undefined ? { hrBpm: Math.round(hr + noise) } : {}),
            ...(pw !== undefined ? { powerW: Math.max(0, Math.round(pw + noise * 3)) } : {}),
            ...(sp !== undefined ? { speedKmh: sp } : {}),
          });
        }
      }
    } else if (bike && !partial) seconds = ride(durationMin, 1 + (past.indexOf(p) % 3), true);
    if (seconds?.length)
      await importActivity(
        athlete,
        athleteId,
        { name: `${p.date}-${sport}.fit`, bytes: recording(p.date, 7, p.sport, seconds) },
        p.id,
      );
  }
  // Nine earlier weeks (weeks 3 to 11 back): four sessions a week, for the load chart and the acute:chronic ratio.
  const monday = mondayOf(utcToday());
  for (let w = 11; w >= 3; w--) {
    for (const [d, minutes, rpe] of [
      [1, 60, 6],
      [2, 45, 3],
      [3, 60, 5],
      [5, 100, 4],
    ] as const) {
      const date = addDays(monday, -7 * w + d);
      const durationMin = Math.round(minutes * (0.9 + random() * 0.2));
      const seconds = ride(durationMin, d, w <= 4);
      if (seconds) {
        const imported = await importActivity(athlete, athleteId, {
          name: `${date}-ride.fit`,
          bytes: recording(date, 17, "cycling", seconds),
        });
        await updateLog(athlete, imported.logId, { rpe });
      } else {
        await logUnplannedSession(
          athlete,
          athleteId,
          unplannedLogSchema.parse({
            status: "done",
            date,
            sport: profile.sports[0] ?? "running",
            title: "Logged session",
            durationMin,
            rpe,
          }),
        );
      }
    }
  }
}

/** Writes the demo when the database has no users; returns whether it did. */
export async function seedDemo(): Promise<boolean> {
  const db = getDb();
  const [{ count }] = (await db.execute(sql`select count(*)::int as count from "user"`)) as unknown as [
    { count: number },
  ];
  if (count > 0) return false;
  try {
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const people = new Map<string, string>();
    for (const person of DEMO_PEOPLE) people.set(person.email, await account(person.name, person.email, passwordHash));
    await account(DEMO_ADMIN.name, DEMO_ADMIN.email, passwordHash, true);
    const coachId = people.get("coach@northfold.test")!;
    // The demo brings its own library instead of the starter templates.
    const { id: squadId } = await createSquad(await actorForUser(coachId), DEMO_SQUAD_NAME, {
      starterTemplates: false,
    });
    // Invitations are an e-mail round trip; the demo's members join directly.
    for (const person of DEMO_PEOPLE.filter((p) => p.role !== "head_coach"))
      await db.insert(schema.membership).values({ squadId, userId: people.get(person.email)!, role: person.role });
    const coach = await actorForUser(coachId);
    for (const person of DEMO_PEOPLE.filter((p) => p.profile)) {
      const athleteId = people.get(person.email)!;
      await updateAthleteProfile(coach, athleteId, person.profile!);
      // Readiness answered (all no), by the athlete.
      const answers = Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, false]));
      await saveScreening(await actorForUser(athleteId), athleteId, screeningSchema.parse({ answers }));
      for (const t of person.tests ?? []) await seedTest(coachId, athleteId, person.profile!.bodyMassKg, t);
    }
    await seedPlans(squadId, coachId, people);
    for (const person of DEMO_PEOPLE.filter((p) => p.role === "athlete"))
      await seedLogs(person, people.get(person.email)!);
    return true;
  } catch (e) {
    // The database was empty: empty it again, so that the next start seeds afresh instead of keeping half a demo.
    const tables = (await db.execute(
      sql`select tablename from pg_tables where schemaname = 'public' and tablename not like '%migrations%'`,
    )) as unknown as { tablename: string }[];
    if (tables.length)
      await db.execute(sql.raw(`truncate ${tables.map((t) => `"${t.tablename}"`).join(", ")} cascade`));
    throw e;
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  seedDemo()
    .then((seeded) => console.log(seeded ? "seeded" : "not empty"))
    .catch((e) => {
      console.error(e instanceof Error ? (e.stack ?? e.message) : e);
      process.exitCode = 1;
    })
    .finally(() => closeDb());
}
