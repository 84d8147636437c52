/** Builds the production app when its sources changed since the last build. */
import { spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";

const ROOT = path.resolve(import.meta.dirname, "..");
const SOURCES = ["app", "features", "db", "emails", "public"];
const FILES = ["package-lock.json", "next.config.ts", "proxy.ts", "postcss.config.mjs", "tsconfig.json"];

function walk(dir: string, out: string[]): void {
  if (!fs.existsSync(dir)) return;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) walk(p, out);
    else out.push(p);
  }
}

export function sourceHash(): string {
  const files: string[] = [];
  for (const d of SOURCES) walk(path.join(ROOT, d), files);
  for (const f of FILES) if (fs.existsSync(path.join(ROOT, f))) files.push(path.join(ROOT, f));
  const h = createHash("sha256");
  for (const f of files.sort()) {
    h.update(path.relative(ROOT, f));
    h.update(fs.readFileSync(f));
  }
  return h.digest("hex");
}

export function ensureBuild(distDir: string, env: NodeJS.ProcessEnv, log: (l: string) => void = console.log): void {
  const marker = path.join(ROOT, distDir, "tidemark-source-hash");
  const hash = sourceHash();
  if (
    fs.existsSync(marker) &&
    fs.readFileSync(marker, "utf8") === hash &&
    fs.existsSync(path.join(ROOT, distDir, "BUILD_ID"))
  ) {
    log("The production build is up to date.");
    return;
  }
  log("Building the app for production (first start or changed sources; takes a minute or two)…");
  const r = spawnSync(process.execPath, [path.join(ROOT, "node_modules/next/dist/bin/next"), "build"], {
    cwd: ROOT,
    stdio: "inherit",
    env: { ...env, TIDEMARK_DIST_DIR: distDir, NEXT_TELEMETRY_DISABLED: "1" },
  });
  if (r.status !== 0) throw new Error("`next build` failed; see the output above.");
  fs.writeFileSync(marker, hash);
}
