/**
 * Demo data for the invented coaching practice "Northfold Endurance". Every name and number here is invented for the demo.
 * Loaded by `npm start` when the database has no users.
 */
import { randomUUID } from "node:crypto";
import { sql as rawSql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import { hashPassword } from "better-auth/crypto";
import * as schema from "./schema";

export const DEMO_PASSWORD = "northfold-demo";

type Role = "head_coach" | "coach" | "athlete";
type Profile = Omit<typeof schema.athleteProfile.$inferInsert, "userId">;

interface DemoPerson {
  email: string;
  name: string;
  role: Role;
  profile?: Profile;
}

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: "coach@northfold.test", name: "Maren Holt", role: "head_coach" },
  { email: "assistant@northfold.test", name: "Tobias Lind", role: "coach" },
  {
    email: "runner@northfold.test",
    name: "Ines Varga",
    role: "athlete",
    profile: { birthYear: 1991, sex: "female", bodyMassKg: 56, restingHrBpm: 48, maxHrBpm: 188, sports: ["running"], timeZone: "Europe/Oslo", reminderTiming: "evening_before", reminderTime: "19:30" },
  },
  {
    email: "cyclist@northfold.test",
    name: "Jonas Okafor",
    role: "athlete",
    profile: { birthYear: 1986, sex: "male", bodyMassKg: 74, restingHrBpm: 46, maxHrBpm: 184, sports: ["cycling"], timeZone: "Europe/Berlin", reminderTiming: "morning_of", reminderTime: "06:30" },
  },
  {
    email: "triathlete@northfold.test",
    name: "Saga Brenner",
    role: "athlete",
    profile: { birthYear: 1995, sex: "female", bodyMassKg: 61, restingHrBpm: 50, maxHrBpm: 192, sports: ["triathlon", "running", "cycling", "swimming"], timeZone: "Europe/Stockholm", reminderTiming: "evening_before", reminderTime: "20:00" },
  },
  {
    email: "rower@northfold.test",
    name: "Priya Castell",
    role: "athlete",
    profile: { birthYear: 1999, sex: "female", bodyMassKg: 70, restingHrBpm: 52, maxHrBpm: 196, sports: ["rowing"], timeZone: "Europe/London", reminderTiming: "morning_of", reminderTime: "05:45" },
  },
  {
    email: "walker@northfold.test",
    name: "Edwin Marsh",
    role: "athlete",
    profile: { birthYear: 1962, sex: "male", bodyMassKg: 86, restingHrBpm: 64, maxHrBpm: 160, sports: ["walking"], timeZone: "Europe/Dublin", reminderTiming: "evening_before", reminderTime: "18:00" },
  },
  {
    email: "skier@northfold.test",
    name: "Lotte Aune",
    role: "athlete",
    profile: { birthYear: 1993, sex: "female", bodyMassKg: 63, restingHrBpm: 44, maxHrBpm: 190, sports: ["cross_country_skiing", "running"], timeZone: "Europe/Oslo", reminderTiming: "evening_before", reminderTime: "19:00" },
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
      }
    });
    return true;
  } finally {
    await client.end();
  }
}
