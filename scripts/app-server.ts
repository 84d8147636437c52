/** Starts the production app server on a port and waits until it answers. */
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { ROOT } from "./env";

export interface AppServer {
  origin: string;
  process: ChildProcess;
  stop(): Promise<void>;
}

export async function waitForHttp(url: string, child: ChildProcess, timeoutMs = 120_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error("The app server exited during start-up; see the output above.");
    try {
      const res = await fetch(url, { redirect: "manual" });
      if (res.status < 500) return;
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`The app did not answer at ${url} within ${timeoutMs / 1000} s.`);
}

export async function startAppServer(opts: {
  mode: "start" | "dev";
  port: number;
  env: NodeJS.ProcessEnv;
  quiet?: boolean;
}): Promise<AppServer> {
  const origin = `http://127.0.0.1:${opts.port}`;
  const child = spawn(
    process.execPath,
    [path.join(ROOT, "node_modules/next/dist/bin/next"), opts.mode, "-H", "127.0.0.1", "-p", String(opts.port)],
    { cwd: ROOT, env: opts.env, stdio: opts.quiet ? ["ignore", "ignore", "inherit"] : "inherit" },
  );
  await waitForHttp(`${origin}/`, child);
  return {
    origin,
    process: child,
    async stop() {
      if (child.exitCode !== null) return;
      child.kill("SIGTERM");
      await new Promise((r) => child.once("exit", r));
    },
  };
}
