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

/** The local installation's database, as `npm start` runs it (PGPORT, default 54329), unless DATABASE_URL is set. */
export function databaseUrlFromEnvOrLocal(): string {
  return process.env.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${intFromEnv("PGPORT", 54329)}/tidemark`;
}

/** What the app, the worker and the operator commands need to send e-mail locally: the fake of the e-mail API. */
export function localMailEnv(): Record<string, string> {
  const fakePort = intFromEnv("FAKE_EMAIL_PORT", 4010);
  return {
    BETTER_AUTH_SECRET: localAuthSecret(),
    BETTER_AUTH_URL: process.env.BETTER_AUTH_URL ?? `http://127.0.0.1:${intFromEnv("PORT", 3000)}`,
    // Without a real API key the SDK talks to the local fake; with RESEND_API_KEY and no RESEND_BASE_URL, to the service.
    ...(process.env.RESEND_API_KEY && !process.env.RESEND_BASE_URL
      ? {}
      : { RESEND_BASE_URL: process.env.RESEND_BASE_URL ?? `http://127.0.0.1:${fakePort}` }),
    SMTP_PORT: process.env.SMTP_PORT ?? String(intFromEnv("FAKE_SMTP_PORT", 2525)),
  };
}
