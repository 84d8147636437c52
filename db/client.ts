import { drizzle, type PostgresJsDatabase } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import { sql as sqlTag } from "drizzle-orm";
import * as schema from "./schema";
import { config } from "@/features/platform/server/config";

export type Database = PostgresJsDatabase<typeof schema>;

const globalForDb = globalThis as unknown as { tidemarkSql?: postgres.Sql; tidemarkDb?: Database };

function databaseUrl(): string {
  const url = config().database.url;
  if (!url)
    throw new Error("DATABASE_URL is not set. Start Tidemark with `npm start` (it starts PostgreSQL and sets it).");
  return url;
}

/** The one database client. Connections open lazily, so importing this module never touches the network. */
export function getDb(): Database {
  if (!globalForDb.tidemarkDb) {
    const sql = postgres(databaseUrl(), {
      max: config().database.poolSize,
      onnotice: () => {},
      connection: { application_name: "tidemark" },
    });
    globalForDb.tidemarkSql = sql;
    globalForDb.tidemarkDb = drizzle(sql, { schema, casing: "snake_case" });
  }
  return globalForDb.tidemarkDb;
}

export async function closeDb(): Promise<void> {
  await globalForDb.tidemarkSql?.end({ timeout: 5 });
  globalForDb.tidemarkSql = undefined;
  globalForDb.tidemarkDb = undefined;
}

export { schema };

/**
 * `column = any(…)` for a list of ids sent as one JSON parameter: the statement is the same for any number of ids, and
 * hundreds of ids cost one parameter to build and send rather than one each.
 */
export function anyOf(ids: readonly string[]) {
  return sqlTag`any(array(select json_array_elements_text(${JSON.stringify(ids)}::json)))`;
}
