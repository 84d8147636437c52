/**
 * PostgreSQL lifecycle for `npm start` and `npm test`: find (or install) Debian's server binaries, initialise a cluster,
 * start it on 127.0.0.1 only, create the database, wait until it accepts connections, and stop it cleanly.
 * The server refuses to run as root, so as root every server command runs as the `postgres` user.
 */
import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import postgres from "postgres";

const DEBIAN_ROOT = "/usr/lib/postgresql";
const REQUIRED = ["initdb", "pg_ctl", "postgres"] as const;

export interface Cluster {
  dataDir: string;
  port: number;
  host: "127.0.0.1";
  url(database: string): string;
  stop(): Promise<void>;
}

function isRoot(): boolean {
  return typeof process.getuid === "function" && process.getuid() === 0;
}

/** The newest Debian server binary folder that has initdb, pg_ctl and postgres, or null. */
export function findServerBinaries(): string | null {
  if (process.env.PG_BIN_DIR && REQUIRED.every((b) => fs.existsSync(path.join(process.env.PG_BIN_DIR!, b)))) {
    return process.env.PG_BIN_DIR;
  }
  if (!fs.existsSync(DEBIAN_ROOT)) return null;
  const versions = fs
    .readdirSync(DEBIAN_ROOT)
    .filter((v) => /^\d+$/.test(v))
    .sort((a, b) => Number(b) - Number(a));
  for (const v of versions) {
    const dir = path.join(DEBIAN_ROOT, v, "bin");
    if (REQUIRED.every((b) => fs.existsSync(path.join(dir, b)))) return dir;
  }
  return null;
}

/** Finds the binaries; installs Debian's `postgresql` when missing and root; otherwise stops with what to install. */
export function ensureServerBinaries(log: (line: string) => void = console.log): string {
  const found = findServerBinaries();
  if (found) return found;
  if (!isRoot()) {
    throw new Error(
      "PostgreSQL server binaries not found in /usr/lib/postgresql/*/bin. Install them with: sudo apt-get install -y postgresql",
    );
  }
  log("PostgreSQL is not installed; installing Debian's postgresql package (apt-get install -y postgresql)…");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  let r = spawnSync("apt-get", ["install", "-y", "postgresql"], { stdio: "inherit", env });
  if (r.status !== 0) {
    spawnSync("apt-get", ["update"], { stdio: "inherit", env });
    r = spawnSync("apt-get", ["install", "-y", "postgresql"], { stdio: "inherit", env });
  }
  const after = findServerBinaries();
  if (r.status !== 0 || !after) throw new Error("Installing postgresql with apt-get failed; see the output above.");
  return after;
}

/** Runs a server binary, as the `postgres` user when we are root. */
function runServerCommand(binDir: string, command: string, args: string[]): string {
  const bin = path.join(binDir, command);
  const [file, fullArgs] = isRoot() ? ["runuser", ["-u", "postgres", "--", bin, ...args]] : [bin, args];
  return execFileSync(file, fullArgs, { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
}

function giveToPostgresUser(dir: string): void {
  if (isRoot()) execFileSync("chown", ["-R", "postgres:postgres", dir]);
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      const port = typeof addr === "object" && addr ? addr.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

/** The pid of a running server for this data folder, or null. */
export function runningServerPid(dataDir: string): number | null {
  const pidFile = path.join(dataDir, "postmaster.pid");
  if (!fs.existsSync(pidFile)) return null;
  const pid = Number(fs.readFileSync(pidFile, "utf8").split("\n")[0]);
  if (!Number.isInteger(pid) || pid <= 0) return null;
  try {
    process.kill(pid, 0);
    return pid;
  } catch {
    return null;
  }
}

async function waitForConnections(url: string, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let lastError: unknown;
  while (Date.now() < deadline) {
    const sql = postgres(url, { max: 1, connect_timeout: 2, onnotice: () => {} });
    try {
      await sql`select 1`;
      await sql.end();
      return;
    } catch (e) {
      lastError = e;
      await sql.end({ timeout: 1 }).catch(() => {});
      await new Promise((r) => setTimeout(r, 200));
    }
  }
  throw new Error(`PostgreSQL did not accept connections within ${timeoutMs / 1000} s: ${String(lastError)}`);
}

export interface StartOptions {
  dataDir: string;
  port: number;
  /** Throwaway clusters trade durability for speed. */
  durable?: boolean;
  log?: (line: string) => void;
}

export async function startCluster(opts: StartOptions): Promise<Cluster> {
  const log = opts.log ?? console.log;
  const binDir = ensureServerBinaries(log);
  const dataDir = path.resolve(opts.dataDir);
  const existing = runningServerPid(dataDir);
  if (existing) {
    throw new Error(
      `A PostgreSQL server (pid ${existing}) is already running on ${dataDir}. Is another Tidemark running? Stop it first.`,
    );
  }
  if (!fs.existsSync(path.join(dataDir, "PG_VERSION"))) {
    log(`Initialising a PostgreSQL cluster in ${dataDir}…`);
    fs.mkdirSync(dataDir, { recursive: true, mode: 0o700 });
    giveToPostgresUser(dataDir);
    runServerCommand(binDir, "initdb", [
      "-D",
      dataDir,
      "-U",
      "postgres",
      "--auth=trust",
      "--encoding=UTF8",
      "--no-locale",
    ]);
    const conf = [
      "listen_addresses = '127.0.0.1'",
      "unix_socket_directories = ''",
      "max_connections = 200",
      ...(opts.durable === false ? ["fsync = off", "synchronous_commit = off", "full_page_writes = off"] : []),
    ];
    fs.appendFileSync(path.join(dataDir, "postgresql.conf"), `\n# Tidemark\n${conf.join("\n")}\n`);
  }
  giveToPostgresUser(dataDir);
  const logFile = path.join(dataDir, "server.log");
  try {
    runServerCommand(binDir, "pg_ctl", [
      "-D",
      dataDir,
      "-l",
      logFile,
      "-o",
      `-p ${opts.port}`,
      "-w",
      "-t",
      "60",
      "start",
    ]);
  } catch (e) {
    const tail = fs.existsSync(logFile) ? fs.readFileSync(logFile, "utf8").split("\n").slice(-15).join("\n") : "";
    throw new Error(`PostgreSQL failed to start on port ${opts.port}: ${String(e)}\n${tail}`);
  }
  const url = (database: string) => `postgres://postgres@127.0.0.1:${opts.port}/${database}`;
  await waitForConnections(url("postgres"));
  let stopped = false;
  return {
    dataDir,
    port: opts.port,
    host: "127.0.0.1",
    url,
    async stop() {
      if (stopped) return;
      stopped = true;
      try {
        runServerCommand(binDir, "pg_ctl", ["-D", dataDir, "-m", "fast", "-w", "-t", "30", "stop"]);
      } catch (e) {
        if (runningServerPid(dataDir)) throw e;
      }
    },
  };
}

/** Creates the database when it does not exist yet. */
export async function createDatabase(cluster: Cluster, name: string): Promise<void> {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`Invalid database name: ${name}`);
  const sql = postgres(cluster.url("postgres"), { max: 1, onnotice: () => {} });
  try {
    const rows = await sql`select 1 from pg_database where datname = ${name}`;
    if (rows.length === 0) await sql.unsafe(`create database ${name}`);
  } finally {
    await sql.end();
  }
}

/** A cluster for the tests: a free port, a temporary folder, removed by stop(). */
export async function startThrowawayCluster(log: (line: string) => void = () => {}): Promise<Cluster> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), "tidemark-pg-"));
  fs.chmodSync(dataDir, 0o700);
  const port = await freePort();
  let cluster: Cluster;
  try {
    cluster = await startCluster({ dataDir, port, durable: false, log });
  } catch (e) {
    fs.rmSync(dataDir, { recursive: true, force: true });
    throw e;
  }
  return {
    ...cluster,
    async stop() {
      try {
        await cluster.stop();
      } finally {
        fs.rmSync(dataDir, { recursive: true, force: true });
      }
    },
  };
}
