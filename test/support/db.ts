import postgres from "postgres";

/** Empties every application table of the integration database (the migrations table stays). */
export async function resetDatabase(): Promise<void> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set: run the integration tests through `npm test`.");
  const sql = postgres(url, { max: 1, onnotice: () => {} });
  try {
    const tables = await sql<{ tablename: string }[]>`select tablename from pg_tables where schemaname = 'public'`;
    if (tables.length) await sql.unsafe(`truncate ${tables.map((t) => `"${t.tablename}"`).join(", ")} cascade`);
  } finally {
    await sql.end();
  }
}

export async function query<T extends object>(text: string, params: (string | number | null)[] = []): Promise<T[]> {
  const sql = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
  try {
    return (await sql.unsafe(text, params)) as unknown as T[];
  } finally {
    await sql.end();
  }
}
