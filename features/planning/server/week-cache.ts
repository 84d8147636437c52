import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import type { Membership } from "@/features/access/lib/rules";

/**
 * Finished answers of `GET /api/athletes/:id/weeks`, kept in this process and used only while still true: each is stored
 * under the athlete's change counter (`roster_cache.generation`, bumped by database triggers on every change to the
 * athlete's sessions, logs, tests, zone sets, seasons, profile and account, whichever code path made it) and the day it
 * was computed for. The counter is read from the database on every request, so several server processes never serve
 * each other's stale answers; a planner page that asks again without a change in between gets the stored answer.
 */

const MAX_ENTRIES = 300;
const answers = new Map<string, { generation: number; body: string }>();

/**
 * The athlete's squad memberships (for the access check), change counter and time zone, in one query. Every account has its counter
 * row from creation (migration 0007); for one that somehow lacks it, the counter is null and nothing is stored. Read
 * before the data it guards: a change made meanwhile then makes the stored answer look older than it is, never newer.
 */
export async function athleteMembershipsAndGeneration(
  athleteId: string,
): Promise<{ memberships: Membership[]; generation: number | null; timeZone: string | null }> {
  const rows = await getDb().execute<{
    generation: string | null;
    time_zone: string | null;
    squad_id: string | null;
    role: Membership["role"] | null;
  }>(sql`
    select c.generation, p.time_zone, m.squad_id, m.role
    from (select ${athleteId}::text as id) a
    left join roster_cache c on c.athlete_id = a.id
    left join athlete_profile p on p.user_id = a.id
    left join membership m on m.user_id = a.id`);
  return {
    memberships: rows.filter((r) => r.squad_id !== null).map((r) => ({ squadId: r.squad_id!, role: r.role! })),
    generation: rows[0]?.generation == null ? null : Number(rows[0].generation),
    timeZone: rows[0]?.time_zone ?? null,
  };
}

export function cachedAnswer(key: string, generation: number): string | undefined {
  const hit = answers.get(key);
  if (!hit) return undefined;
  if (hit.generation !== generation) {
    answers.delete(key);
    return undefined;
  }
  // Most recently used last, so that the oldest are dropped first.
  answers.delete(key);
  answers.set(key, hit);
  return hit.body;
}

export function storeAnswer(key: string, generation: number, body: string): void {
  if (answers.size >= MAX_ENTRIES) answers.delete(answers.keys().next().value!);
  answers.set(key, { generation, body });
}

/** Empties this process's store of answers (for measuring the path that computes them). */
export function forgetAllAnswers(): void {
  answers.clear();
}
