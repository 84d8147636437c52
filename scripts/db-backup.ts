/**
 * Backups with Debian's PostgreSQL client: `npm run db:backup [-- FILE]` writes a custom-format dump (pg_dump -Fc) of the
 * database (DATABASE_URL, or the local installation's), by default to .data/backups/tidemark-<UTC time>.dump;
 * `npm run db:restore -- FILE` restores one into it, replacing what is there (pg_restore --clean --if-exists), in one
 * transaction. Both work while `npm start` runs.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { DATA_DIR, databaseUrlFromEnvOrLocal } from "./env";
import { findServerBinaries } from "./postgres";

function tool(name: "pg_dump" | "pg_restore"): string {
  const dir = findServerBinaries();
  if (dir && fs.existsSync(path.join(dir, name))) return path.join(dir, name);
  return name; // on PATH, e.g. postgresql-client
}

function run(cmd: string, args: string[]): void {
  const r = spawnSync(cmd, args, { stdio: ["ignore", "inherit", "pipe"], encoding: "utf8" });
  if (r.error)
    throw new Error(`${path.basename(cmd)} could not run (${r.error.message}). Install Debian's postgresql-client.`);
  if (r.status !== 0) throw new Error(`${path.basename(cmd)} failed: ${r.stderr.trim() || `exit ${r.status}`}`);
}

export function backupDatabase(url: string, file: string): string {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  run(tool("pg_dump"), ["--format=custom", "--no-owner", "--file", file, url]);
  return file;
}

export function restoreDatabase(url: string, file: string): void {
  if (!fs.existsSync(file)) throw new Error(`No backup file at ${file}.`);
  run(tool("pg_restore"), [
    "--clean",
    "--if-exists",
    "--no-owner",
    "--single-transaction",
    "--exit-on-error",
    "--dbname",
    url,
    file,
  ]);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const [mode, file] = process.argv.slice(2);
  const url = databaseUrlFromEnvOrLocal();
  try {
    if (mode === "backup") {
      const target =
        file ?? path.join(DATA_DIR, "backups", `tidemark-${new Date().toISOString().replace(/[:.]/g, "-")}.dump`);
      console.log(`Backed up to ${backupDatabase(url, target)}`);
    } else if (mode === "restore" && file) {
      restoreDatabase(url, file);
      console.log(`Restored ${file}.`);
    } else {
      console.error("Usage: npm run db:backup [-- FILE] | npm run db:restore -- FILE");
      process.exit(2);
    }
  } catch (e) {
    console.error(e instanceof Error ? e.message : String(e));
    process.exit(1);
  }
}
