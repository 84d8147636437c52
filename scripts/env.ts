/** Settings shared by the start and test harnesses. */
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";

export const ROOT = path.resolve(import.meta.dirname, "..");
export const DATA_DIR = path.join(ROOT, ".data");

/** A secret for signing sessions, made once per checkout and kept in .data (git-ignored). */
export function localAuthSecret(): string {
  if (process.env.BETTER_AUTH_SECRET) return process.env.BETTER_AUTH_SECRET;
  const file = path.join(DATA_DIR, "auth-secret");
  if (!fs.existsSync(file)) {
    fs.mkdirSync(DATA_DIR, { recursive: true });
    fs.writeFileSync(file, randomBytes(32).toString("base64url"), { mode: 0o600 });
  }
  return fs.readFileSync(file, "utf8").trim();
}

export function intFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === "") return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n <= 0 || n > 65535) throw new Error(`${name} must be a port number, got "${raw}".`);
  return n;
}
