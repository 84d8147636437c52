/**
 * `npx tsx scripts/import-graph.ts [--list]`: the TypeScript imports between the project's folders, checked against the
 * layout rules (DEVELOPERS.md → Layout):
 *   1. a feature's lib/ imports only lib/ folders and the shared layer (features/platform/lib);
 *   2. components never import server/;
 *   3. another feature's server/ is reached only through its server/index.ts;
 *   4. only app/ and scripts/ import app/.
 * Prints the number of imports that break a rule and the folder-level cycles (strongly connected components of the graph
 * whose nodes are folders such as features/planning/lib). Exit 1 when there is either.
 */
import fs from "node:fs";
import path from "node:path";

const ROOT = path.resolve(import.meta.dirname, "..");
const DIRS = ["app", "features", "db", "emails", "scripts"];
const EXT = [".ts", ".tsx", ".mts", ".mjs"];

function walk(dir: string, out: string[]) {
  if (!fs.existsSync(dir)) return;
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) {
      if (e.name === "node_modules" || e.name === "migrations") continue;
      walk(p, out);
    } else if (EXT.includes(path.extname(e.name)) && !/\.test\.tsx?$/.test(e.name)) out.push(p);
  }
}

function resolveImport(from: string, spec: string): string | null {
  let base: string;
  if (spec.startsWith("@/")) base = path.join(ROOT, spec.slice(2));
  else if (spec.startsWith(".")) base = path.resolve(path.dirname(from), spec);
  else return null;
  for (const cand of [base, ...EXT.map((e) => base + e), ...EXT.map((e) => path.join(base, "index" + e))]) {
    if (fs.existsSync(cand) && fs.statSync(cand).isFile()) return cand;
  }
  return null;
}

/** The folder a file belongs to, as a node of the graph: features/<name>/<lib|server|components> or the file's kind. */
export function nodeOf(file: string): string {
  const rel = path.relative(ROOT, file).split(path.sep);
  if (rel[0] === "features") {
    const [, name, sub] = rel;
    if (sub === "lib" || sub === "server" || sub === "components") return `features/${name}/${sub}`;
    return `features/${name}/${sub!.replace(/\.tsx?$/, "")}`;
  }
  return rel[0]!;
}

export interface Violation {
  from: string;
  to: string;
  rule: string;
}

export function violation(fromFile: string, toFile: string): Violation | null {
  const from = path.relative(ROOT, fromFile),
    to = path.relative(ROOT, toFile);
  const f = from.split(path.sep),
    t = to.split(path.sep);
  const v = (rule: string) => ({ from, to, rule });
  if (t[0] === "app" && f[0] !== "app" && f[0] !== "scripts") return v("only app/ and scripts/ import app/");
  if (f[0] === "features" && f[2] === "lib") {
    const sharedLib = t[0] === "features" && t[1] === "platform" && t[2] === "lib";
    const lib = t[0] === "features" && t[2] === "lib";
    if (!lib && !sharedLib) return v("lib/ imports only lib/ and the shared layer");
  }
  if (f[0] === "features" && f[2] === "components" && t[0] === "features" && t[2] === "server")
    return v("components never import server/");
  // The shared layer (features/platform) is open to everyone.
  if (
    f[0] === "features" &&
    t[0] === "features" &&
    t[1] !== "platform" &&
    t[2] === "server" &&
    f[1] !== t[1] &&
    t[3] !== "index.ts"
  ) {
    return v("another feature's server/ only through its server/index.ts");
  }
  return null;
}

function importsOf(file: string): string[] {
  const text = fs.readFileSync(file, "utf8");
  const specs = new Set<string>();
  for (const m of text.matchAll(
    /(?:import|export)\s[^'"]*?from\s*["']([^"']+)["']|import\(\s*["']([^"']+)["']\s*\)|^import\s*["']([^"']+)["']/gm,
  )) {
    specs.add(m[1] ?? m[2] ?? m[3]!);
  }
  return [...specs];
}

/** Strongly connected components with more than one node (Tarjan). */
function cycles(graph: Map<string, Set<string>>): string[][] {
  let index = 0;
  const idx = new Map<string, number>(),
    low = new Map<string, number>(),
    on = new Set<string>(),
    stack: string[] = [],
    out: string[][] = [];
  const visit = (v: string) => {
    idx.set(v, index);
    low.set(v, index++);
    stack.push(v);
    on.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!idx.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (on.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
    }
    if (low.get(v) === idx.get(v)) {
      const comp: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        on.delete(w);
        comp.push(w);
      } while (w !== v);
      if (comp.length > 1) out.push(comp.sort());
    }
  };
  for (const v of graph.keys()) if (!idx.has(v)) visit(v);
  return out;
}

export function analyse() {
  const files: string[] = [];
  for (const d of DIRS) walk(path.join(ROOT, d), files);
  const graph = new Map<string, Set<string>>();
  const violations: Violation[] = [];
  for (const file of files) {
    for (const spec of importsOf(file)) {
      const target = resolveImport(file, spec);
      if (!target) continue;
      const a = nodeOf(file),
        b = nodeOf(target);
      if (a !== b) {
        if (!graph.has(a)) graph.set(a, new Set());
        graph.get(a)!.add(b);
      }
      const bad = violation(file, target);
      if (bad) violations.push(bad);
    }
  }
  return { files: files.length, violations, cycles: cycles(graph) };
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) {
  const { files, violations, cycles: cyc } = analyse();
  console.log(`${files} files; ${violations.length} imports break a layout rule; ${cyc.length} folder-level cycle(s).`);
  if (process.argv.includes("--list")) {
    for (const v of violations) console.log(`  ${v.from} → ${v.to}  (${v.rule})`);
    for (const c of cyc) console.log(`  cycle: ${c.join(" ⇄ ")}`);
  }
  process.exit(violations.length || cyc.length ? 1 : 0);
}
