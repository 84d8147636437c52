/**
 * Demo data for the invented coaching practice "Northfold Endurance". Every name and number here is invented for the demo.
 * Loaded by `npm start` when the database has no users.
 */
import { randomUUID } from "node:crypto";
import { sql as rawSql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import { hashPassword } from "better-auth/crypto";
import { gasExchangeRecord, talkTestRecord } from "../features/athlete-tests/lib/records";
import type { TalkTestInput } from "../features/field-tests/lib/talk-test";
import { analyzeCsv } from "../features/gas-exchange/lib/analyze";
import { syntheticRamp, type RampOptions } from "../features/gas-exchange/lib/synthetic-ramp";
import { threeZones } from "../features/zones/lib/zones";
import * as schema from "./schema";

export const DEMO_PASSWORD = "northfold-demo";

type Role = "head_coach" | "coach" | "athlete";
type Profile = Omit<typeof schema.athleteProfile.$inferInsert, "userId">;

type DemoTest =
  | { kind: "gas"; daysAgo: number; sport: string; protocol: string; ramp: RampOptions }
  | { kind: "talk"; daysAgo: number; sport: string; protocol: string; talk: TalkTestInput };

interface DemoPerson {
  email: string;
  name: string;
  role: Role;
  profile?: Profile;
  tests?: DemoTest[];
}

const talkStages = (start: number, step: number, hr0: number, hrStep: number, firstUneasy: number, firstSilent: number, unit: "km/h" | "W"): TalkTestInput => ({
  workloadUnit: unit,
  stages: Array.from({ length: firstSilent + 1 }, (_, i) => ({
    workload: Math.round((start + i * step) * 10) / 10,
    durationS: 180,
    hrBpm: hr0 + i * hrStep,
    speech: i >= firstSilent ? ("cannot_speak" as const) : i >= firstUneasy ? ("not_fully_comfortable" as const) : ("comfortable" as const),
  })),
});

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: "coach@northfold.test", name: "Maren Holt", role: "head_coach" },
  { email: "assistant@northfold.test", name: "Tobias Lind", role: "coach" },
  {
    email: "runner@northfold.test",
    name: "Ines Varga",
    role: "athlete",
    profile: { birthYear: 1991, sex: "female", bodyMassKg: 56, restingHrBpm: 48, maxHrBpm: 188, sports: ["running"], timeZone: "Europe/Oslo", reminderTiming: "evening_before", reminderTime: "19:30" },
    tests: [
      { kind: "talk", daysAgo: 190, sport: "running", protocol: "treadmill talk test, +1 km/h every 3 min", talk: talkStages(9, 1, 128, 8, 3, 6, "km/h") },
      { kind: "talk", daysAgo: 82, sport: "running", protocol: "treadmill talk test, +1 km/h every 3 min", talk: talkStages(9, 1, 126, 8, 4, 7, "km/h") },
    ],
  },
  {
    email: "cyclist@northfold.test",
    name: "Jonas Okafor",
    role: "athlete",
    profile: { birthYear: 1986, sex: "male", bodyMassKg: 74, restingHrBpm: 46, maxHrBpm: 184, sports: ["cycling"], timeZone: "Europe/Berlin", reminderTiming: "morning_of", reminderTime: "06:30" },
    tests: [{ kind: "gas", daysAgo: 80, sport: "cycling", protocol: "cycle ergometer ramp, 25 W/min after 3 min at 50 W", ramp: { seed: 11, massKg: 74, peakW: 390, hrRest: 88, hrMax: 184 } }],
  },
  {
    email: "triathlete@northfold.test",
    name: "Saga Brenner",
    role: "athlete",
    profile: { birthYear: 1995, sex: "female", bodyMassKg: 61, restingHrBpm: 50, maxHrBpm: 192, sports: ["triathlon", "running", "cycling", "swimming"], timeZone: "Europe/Stockholm", reminderTiming: "evening_before", reminderTime: "20:00" },
    tests: [
      { kind: "gas", daysAgo: 60, sport: "cycling", protocol: "cycle ergometer ramp, 20 W/min after 3 min at 50 W", ramp: { seed: 23, massKg: 61, peakW: 300, rampWPerMin: 20, hrRest: 90, hrMax: 192 } },
      { kind: "talk", daysAgo: 55, sport: "running", protocol: "track talk test, +0.5 km/h every 3 min", talk: talkStages(9, 0.5, 132, 6, 5, 9, "km/h") },
    ],
  },
  {
    email: "rower@northfold.test",
    name: "Priya Castell",
    role: "athlete",
    profile: { birthYear: 1999, sex: "female", bodyMassKg: 70, restingHrBpm: 52, maxHrBpm: 196, sports: ["rowing"], timeZone: "Europe/London", reminderTiming: "morning_of", reminderTime: "05:45" },
    tests: [{ kind: "gas", daysAgo: 40, sport: "rowing", protocol: "rowing ergometer ramp, 30 W/min after 3 min at 60 W", ramp: { seed: 37, massKg: 70, warmupW: 60, peakW: 330, rampWPerMin: 30, hrRest: 92, hrMax: 196 } }],
  },
  {
    email: "walker@northfold.test",
    name: "Edwin Marsh",
    role: "athlete",
    profile: { birthYear: 1962, sex: "male", bodyMassKg: 86, restingHrBpm: 64, maxHrBpm: 160, sports: ["walking"], timeZone: "Europe/Dublin", reminderTiming: "evening_before", reminderTime: "18:00" },
    tests: [{ kind: "talk", daysAgo: 30, sport: "walking", protocol: "treadmill walking talk test, +0.5 km/h every 3 min", talk: talkStages(4, 0.5, 92, 7, 4, 7, "km/h") }],
  },
  {
    email: "skier@northfold.test",
    name: "Lotte Aune",
    role: "athlete",
    profile: { birthYear: 1993, sex: "female", bodyMassKg: 63, restingHrBpm: 44, maxHrBpm: 190, sports: ["cross_country_skiing", "running"], timeZone: "Europe/Oslo", reminderTiming: "evening_before", reminderTime: "19:00" },
    tests: [{ kind: "talk", daysAgo: 79, sport: "running", protocol: "uphill treadmill talk test, 8 %, +0.5 km/h every 3 min", talk: talkStages(7, 0.5, 124, 7, 5, 8, "km/h") }],
  },
];

export const DEMO_SQUAD_NAME = "Northfold Endurance";

/** Loads the demo when the database has no users; returns whether it did. One transaction. */
export async function seedDemoIfEmpty(databaseUrl: string): Promise<boolean> {
  const client = postgres(databaseUrl, { max: 1, onnotice: () => {} });
  const db = drizzle(client, { schema });
  try {
    const [{ count }] = (await db.execute(rawSql`select count(*)::int as count from "user"`)) as unknown as [{ count: number }];
    if (count > 0) return false;
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const people = new Map<string, string>();
    await db.transaction(async (tx) => {
      const squadId = randomUUID();
      await tx.insert(schema.squad).values({ id: squadId, name: DEMO_SQUAD_NAME });
      for (const person of DEMO_PEOPLE) {
        const userId = randomUUID();
        await tx.insert(schema.user).values({ id: userId, name: person.name, email: person.email, emailVerified: true });
        await tx.insert(schema.account).values({
          id: randomUUID(),
          accountId: userId,
          providerId: "credential",
          userId,
          password: passwordHash,
        });
        await tx.insert(schema.membership).values({ squadId, userId, role: person.role });
        if (person.profile) await tx.insert(schema.athleteProfile).values({ userId, ...person.profile });
        people.set(person.email, userId);
      }
      const coachId = people.get("coach@northfold.test")!;
      for (const person of DEMO_PEOPLE) {
        for (const t of person.tests ?? []) await insertDemoTest(tx, people.get(person.email)!, coachId, person.profile?.bodyMassKg ?? null, t);
      }
    });
    return true;
  } finally {
    await client.end();
  }
}

type Tx = Parameters<Parameters<ReturnType<typeof drizzle<typeof schema>>["transaction"]>[0]>[0];

function daysAgo(n: number): string {
  return new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10);
}

async function insertDemoTest(tx: Tx, athleteId: string, coachId: string, massKg: number | null, t: DemoTest): Promise<void> {
  const id = randomUUID();
  const date = daysAgo(t.daysAgo);
  let record: ReturnType<typeof talkTestRecord>;
  let csv: string | null = null;
  if (t.kind === "gas") {
    csv = syntheticRamp(t.ramp).csv;
    const a = analyzeCsv(csv, { bodyMassKg: massKg });
    if (!a.ok) throw new Error(`demo test for ${athleteId}: ${a.error}`);
    record = gasExchangeRecord(a, massKg);
  } else {
    record = talkTestRecord(t.talk);
  }
  await tx.insert(schema.athleteTest).values({
    id,
    athleteId,
    kind: t.kind === "gas" ? "gas_exchange" : "talk",
    sport: t.sport,
    protocol: t.protocol,
    testDate: date,
    endedBy: t.kind === "gas" ? "exhaustion" : "plan",
    bodyMassKg: massKg,
    input: t.kind === "gas" ? { mapping: {}, filename: "demo-ramp.csv", fiveZones: false } : { talk: t.talk, fiveZones: false },
    result: record.result,
    detected: record.detected,
    createdBy: coachId,
  });
  if (csv) {
    const data = Buffer.from(csv);
    await tx.insert(schema.testFile).values({ testId: id, filename: `northfold-${t.sport}-${date}.csv`, contentType: "text/csv", sizeBytes: data.length, data });
  }
  const { vt1, vt2 } = record.detected;
  if (vt1 && vt2) {
    threeZones(vt1, vt2); // the demo's thresholds must make zones
    await tx.insert(schema.zoneSet).values({ id: randomUUID(), athleteId, sport: t.sport, testId: id, effectiveFrom: date, model: "three", vt1, vt2, source: t.kind === "gas" ? "gas-exchange test (detected)" : "talk test", createdBy: coachId });
  }
}
