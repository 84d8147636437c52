/**
 * `npm run validate [-- --per-cell N] [-- --failures]`: detection rates of the threshold engine on generated lab tests
 * (every protocol × phase pattern × export style, N seeds each; deterministic) and on the three real files.
 * Targets: VT1 ≥ 95 %, VT2 ≥ 97 %, peak ≥ 98 % overall and ≥ 90 % in every row. Exit 1 when a target is missed.
 * `-- --noise` also prints the breath-to-breath scatter of the real files beside the generated ones (the generator's noise
 * is matched to them). A second run with 1.5 × that noise is printed for information (not a target).
 */
import fs from "node:fs";
import path from "node:path";
import { analyzeCsv } from "../features/gas-exchange/lib/analyze";
import { readGasExchangeCsv } from "../features/gas-exchange/lib/csv";
import { labCases, labExport, PROTOCOLS } from "../features/gas-exchange/lib/lab-generator";
import {
  breathScatter,
  groupRates,
  rampBand,
  rates,
  runCase,
  type Rates,
} from "../features/gas-exchange/lib/validation";

const args = process.argv.slice(2);
const perCell = Number(args[args.indexOf("--per-cell") + 1] ?? 2) || 2;
const showFailures = args.includes("--failures");
const results = labCases(args.includes("--per-cell") ? perCell : 2).map(runCase);
const pct = (v: number) => `${v.toFixed(1).padStart(5)} %`;
let missed = false;
const line = (label: string, r: Rates, overall = false) => {
  const [t1, t2, tp] = overall ? [95, 97, 98] : [90, 90, 90];
  const miss = r.vt1 < t1 || r.vt2 < t2 || r.peak < tp;
  if (miss) missed = true;
  console.log(
    `${label.padEnd(26)} ${String(r.n).padStart(4)}  ${pct(r.vt1)}  ${pct(r.vt2)}  ${pct(r.peak)}  ${String(r.beforeRamp).padStart(6)}${miss ? "  ← below target" : ""}`,
  );
};
const head = `${"".padEnd(26)} ${"n".padStart(4)}  ${"VT1".padStart(7)}  ${"VT2".padStart(7)}  ${"peak".padStart(7)}  ${"early".padStart(6)}`;
console.log(
  `Generated lab tests (VT1/VT2 within 6 %, peak within 5 %; "early" = a threshold placed before the ramp)\n`,
);
console.log(head);
line("all", rates(results), true);
for (const [title, key] of [
  ["by protocol", (c: { protocol: string }) => c.protocol],
  ["by phase pattern", (c: { phase: string }) => c.phase],
  ["by export style", (c: { style: string }) => c.style],
] as const) {
  console.log(`\n${title}`);
  for (const [k, r] of groupRates(results, key as (c: (typeof results)[number]["c"]) => string)) line(`  ${k}`, r);
}
console.log(`\nby ramp length (information; guidelines ask for 8–12 min ramps)`);
for (const [k, r] of groupRates(results, (c) => rampBand(results.find((x) => x.c === c)!.rampMin))) {
  console.log(
    `  ${k.padEnd(24)} ${String(r.n).padStart(4)}  ${pct(r.vt1)}  ${pct(r.vt2)}  ${pct(r.peak)}  ${String(r.beforeRamp).padStart(6)}`,
  );
}
const noisier = rates(
  labCases(args.includes("--per-cell") ? perCell : 2).map((c) => runCase({ ...c, noiseScale: 1.5 })),
);
console.log(
  `\nwith 1.5 × the breath noise (information)\n  ${"all".padEnd(24)} ${String(noisier.n).padStart(4)}  ${pct(noisier.vt1)}  ${pct(noisier.vt2)}  ${pct(noisier.peak)}  ${String(noisier.beforeRamp).padStart(6)}`,
);
if (args.includes("--noise")) {
  console.log(`\nBreath-to-breath scatter, % (robust SD against the median of 15 neighbouring breaths)\n`);
  console.log(
    `${"".padEnd(44)} ${"VO2".padStart(5)} ${"RER".padStart(5)} ${"VE/VCO2".padStart(8)} ${"VE/VO2".padStart(7)}`,
  );
  const show = (label: string, b: Parameters<typeof breathScatter>[0]) => {
    const s = breathScatter(b);
    console.log(
      `${label.padEnd(44)} ${String(s.vo2).padStart(5)} ${String(s.rer).padStart(5)} ${String(s.veVco2).padStart(8)} ${String(s.veVo2).padStart(7)}`,
    );
  };
  const realDir = path.resolve("test/fixtures/real-cpet");
  for (const f of fs
    .readdirSync(realDir)
    .filter((x) => x.endsWith(".csv"))
    .sort()) {
    const read = readGasExchangeCsv(fs.readFileSync(path.join(realDir, f), "utf8"));
    if (read.ok) show(`real: ${f}`, read.breaths);
  }
  for (const protocol of PROTOCOLS) {
    const read = readGasExchangeCsv(labExport({ seed: 1, protocol, phase: "warmup", style: "breath" }).csv);
    if (read.ok) show(`generated: ${protocol}`, read.breaths);
  }
}
if (showFailures) {
  console.log("\nMisses:");
  for (const r of results.filter((x) => !x.vt1 || !x.vt2 || !x.peak))
    console.log(`  ${r.c.protocol} / ${r.c.phase} / ${r.c.style} / seed ${r.c.seed}: ${r.detail}`);
}

// The real files against the independent reading in their README (ranges ± 6 %, peak ± 5 %).
const dir = path.resolve("test/fixtures/real-cpet");
const real: [string, [number, number] | null, [number, number] | null, number][] = [
  ["treadmill-ramp-mss-relative-first.csv", [3050, 3250], [3680, 3750], 3850],
  ["treadmill-warmup-ramp-minutes-mph.csv", [2090, 2190], [2620, 2710], 2740],
  ["treadmill-stage-then-ramp-hms.csv", null, [3450, 3500], 3560],
];
console.log(`\nReal files (gasExchangeR, MIT licence; reading in test/fixtures/real-cpet/README.md)\n`);
const inRange = (v: number | undefined, r: [number, number]) => v !== undefined && v >= r[0] * 0.94 && v <= r[1] * 1.06;
for (const [name, vt1, vt2, peak] of real) {
  const a = analyzeCsv(fs.readFileSync(path.join(dir, name), "utf8"));
  if (!a.ok) {
    console.log(`${name}: error ${a.error}`);
    missed = true;
    continue;
  }
  const v1 = vt1
    ? inRange(a.vt1?.vo2MlMin, vt1)
      ? "hit"
      : "miss"
    : a.vt1
      ? a.vt1.vo2MlMin <= 2600 * 1.06
        ? "hit (≤ 2600)"
        : "miss"
      : "not found (reading unclear)";
  const v2 = inRange(a.vt2?.vo2MlMin, vt2!) ? "hit" : "miss";
  const p = Math.abs(a.peak.vo2MlMin - peak) <= 0.05 * peak ? "hit" : "miss";
  console.log(
    `${name.padEnd(40)} VT1 ${String(a.vt1?.vo2MlMin ?? "—").padStart(5)} ${v1.padEnd(28)} VT2 ${String(a.vt2?.vo2MlMin ?? "—").padStart(5)} ${v2.padEnd(5)} peak ${a.peak.vo2MlMin} ${p}`,
  );
}
process.exit(missed ? 1 : 0);
