/**
 * Loads the demo into an empty database by running scripts/seed-demo.ts in its own process (it calls the features'
 * server modules, which need the "server-only" hook that scripts/register-server.mjs installs). Used by `npm start`,
 * `npm test` and the planner bench.
 */
import { spawn } from "node:child_process";
import path from "node:path";
import { ROOT } from "./env";

export { DEMO_ADMIN, DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SQUAD_NAME } from "./demo-data";

/** Writes the demo when the database has no users; returns whether it did. */
export function seedDemoIfEmpty(databaseUrl: string): Promise<boolean> {
  return new Promise((resolve, reject) => {
    const child = spawn(
      process.execPath,
      ["--import", "tsx", "--import", "./scripts/register-server.mjs", path.join(ROOT, "scripts/seed-demo.ts")],
      {
        cwd: ROOT,
        env: { ...process.env, DATABASE_URL: databaseUrl },
        stdio: ["ignore", "pipe", "inherit"],
      },
    );
    let out = "";
    child.stdout.on("data", (d: Buffer) => (out += d.toString()));
    child.on("error", reject);
    child.on("exit", (code) =>
      code === 0
        ? resolve(out.trim().endsWith("seeded"))
        : reject(new Error(`Loading the demo failed (exit ${code}); the database was left empty.`)),
    );
  });
}
