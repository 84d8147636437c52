import "server-only";
import { randomUUID } from "node:crypto";
import { desc, eq, sql } from "drizzle-orm";
import { anyOf, getDb, schema, type Database } from "@/db/client";
import type { ThresholdValues } from "@/features/zones/lib/thresholds";
import { requireAthleteAccess } from "@/features/access/server";
import type { Actor } from "@/features/access/lib/rules";
import { HttpError, notFound } from "@/features/platform/server/http";
import { fiveZones, threeZones, ZoneError, type Zone } from "../lib/zones";
import type { ZoneSetView } from "../lib/views";

export type { ZoneSetView };

type Tx = Pick<Database, "insert" | "update" | "select">;

function point(v: ThresholdValues) {
  return { hrBpm: v.hrBpm ?? null, powerW: v.powerW ?? null, speedKmh: v.speedKmh ?? null };
}

/** The zones of a threshold pair; a 400 with the reason when they do not make zones. */
export function zonesFor(vt1: ThresholdValues, vt2: ThresholdValues): { three: Zone[]; five: Zone[] } {
  try {
    return { three: threeZones(point(vt1), point(vt2)), five: fiveZones(point(vt1), point(vt2)) };
  } catch (e) {
    if (e instanceof ZoneError) throw new HttpError(400, e.message, { fieldErrors: { vt2: [e.message] } });
    throw e;
  }
}

/** A zone set row as the API and the pages show it, with its zones. */
export function zoneSetView(row: typeof schema.zoneSet.$inferSelect): ZoneSetView {
  const z = zonesFor(row.vt1, row.vt2);
  return {
    id: row.id,
    sport: row.sport,
    effectiveFrom: row.effectiveFrom,
    model: row.model === "five" ? "five" : "three",
    source: row.source,
    testId: row.testId,
    vt1: row.vt1,
    vt2: row.vt2,
    zones: z.three,
    fiveZones: row.model === "five" ? z.five : null,
    chosenAt: row.chosenAt ? row.chosenAt.toISOString() : null,
  };
}

/** Among sets of the same sport and day, the one in force: the latest chosen by a coach, else the newest. */
const standing = (row: typeof schema.zoneSet.$inferSelect) => (row.chosenAt ?? row.createdAt).getTime();
const newestFirst = [
  desc(schema.zoneSet.effectiveFrom),
  desc(sql`coalesce(${schema.zoneSet.chosenAt}, ${schema.zoneSet.createdAt})`),
] as const;

/** Creates or replaces the zone set that a test produced (one per test), inside the caller's transaction. */
export async function saveZoneSetForTest(
  tx: Tx,
  p: {
    athleteId: string;
    sport: string;
    testId: string;
    effectiveFrom: string;
    vt1: ThresholdValues;
    vt2: ThresholdValues;
    five: boolean;
    source: string;
    createdBy: string;
  },
): Promise<void> {
  zonesFor(p.vt1, p.vt2); // validates the pair
  const values = {
    athleteId: p.athleteId,
    sport: p.sport,
    testId: p.testId,
    effectiveFrom: p.effectiveFrom,
    model: p.five ? "five" : "three",
    vt1: p.vt1,
    vt2: p.vt2,
    source: p.source,
    createdBy: p.createdBy,
  };
  await tx
    .insert(schema.zoneSet)
    .values({ id: randomUUID(), ...values })
    .onConflictDoUpdate({ target: schema.zoneSet.testId, set: values });
}

/** The zone set in force on a date per sport, and the athlete's history. */
export async function getZones(actor: Actor, athleteId: string, date?: string) {
  await requireAthleteAccess(actor, athleteId, "view");
  const db = getDb();
  const history = await db
    .select()
    .from(schema.zoneSet)
    .where(eq(schema.zoneSet.athleteId, athleteId))
    .orderBy(...newestFirst);
  const day = date ?? new Date().toISOString().slice(0, 10);
  const inForce: Record<string, ZoneSetView> = {};
  // Oldest first, so that the latest effective date wins, and among sets of the same day the chosen one, else the newest.
  const chronological = [...history].sort(
    (a, b) => a.effectiveFrom.localeCompare(b.effectiveFrom) || standing(a) - standing(b),
  );
  for (const row of chronological) {
    if (row.effectiveFrom <= day) inForce[row.sport] = zoneSetView(row);
  }
  return { date: day, inForce, history: history.map(zoneSetView) };
}

/**
 * For other features (no permission check: callers check): every zone set of an athlete, newest first, so that
 * `zoneSetInForce` from the pure library picks the set in force on any date; on a shared date the first in this order
 * wins: the one a coach chose, else the newest.
 */
export async function zoneSetsOf(athleteId: string): Promise<ZoneSetView[]> {
  const rows = await getDb()
    .select()
    .from(schema.zoneSet)
    .where(eq(schema.zoneSet.athleteId, athleteId))
    .orderBy(...newestFirst);
  return rows.map(zoneSetView);
}

/** `zoneSetsOf` for many athletes in one query (no permission check: callers check). */
export async function zoneSetsOfMany(athleteIds: string[]): Promise<Map<string, ZoneSetView[]>> {
  const out = new Map<string, ZoneSetView[]>(athleteIds.map((id) => [id, []]));
  if (!athleteIds.length) return out;
  const rows = await getDb()
    .select()
    .from(schema.zoneSet)
    .where(sql`${schema.zoneSet.athleteId} = ${anyOf(athleteIds)}`)
    .orderBy(...newestFirst);
  for (const r of rows) out.get(r.athleteId)?.push(zoneSetView(r));
  return out;
}

/**
 * A coach chooses which of two (or more) zone sets of the same sport and day is in force: POST /api/zone-sets/:id/choose.
 * Every view reads the choice (sessions' targets, today, the roster: the zone set's trigger bumps the athlete's counter).
 */
export async function chooseZoneSet(actor: Actor, id: string) {
  const db = getDb();
  const [row] = await db.select().from(schema.zoneSet).where(eq(schema.zoneSet.id, id));
  if (!row) throw notFound("No such zone set.");
  await requireAthleteAccess(actor, row.athleteId, "coach");
  const [updated] = await db
    .update(schema.zoneSet)
    .set({ chosenAt: new Date() })
    .where(eq(schema.zoneSet.id, id))
    .returning();
  return zoneSetView(updated!);
}
