// Backups: a round trip through pg_dump and pg_restore (Debian's PostgreSQL client) gives back exactly what was there.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { backupDatabase, restoreDatabase } from "../../scripts/db-backup";
import { query, resetDatabase } from "../support/db";
import { makeSquad } from "../support/squad";

describe("backup and restore", () => {
  it("a backup restores the rows as they were, after they were changed and deleted", async () => {
    await resetDatabase();
    const s = await makeSquad("backup");
    const snapshot = async () => ({
      users: await query<{ id: string; email: string }>(`select id, email from "user" order by id`),
      squads: await query<{ id: string; name: string }>(`select id, name from squad order by id`),
      members: await query<{ user_id: string; role: string }>(`select user_id, role from membership order by user_id`),
      outbox: await query<{ id: string; subject: string }>(`select id, subject from outbox order by id`),
    });
    const before = await snapshot();
    expect(before.members).toHaveLength(4);
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "tidemark-backup-")), "test.dump");
    backupDatabase(process.env.DATABASE_URL!, file);
    expect(fs.statSync(file).size).toBeGreaterThan(1000);
    await query(`update squad set name = 'Renamed' where id = $1`, [s.squadId]);
    await query(`delete from membership where squad_id = $1 and role = 'athlete'`, [s.squadId]);
    expect((await snapshot()).members).toHaveLength(2);
    restoreDatabase(process.env.DATABASE_URL!, file);
    expect(await snapshot()).toEqual(before);
    expect(() => restoreDatabase(process.env.DATABASE_URL!, `${file}.missing`)).toThrow(/No backup file/);
  });
});
