"use client";
import { ScatterChart } from "@/features/charts/components/ScatterChart";

interface Row {
  vo2MlMin: number;
  powerW?: number | null;
  speedKmh?: number | null;
  hrBpm?: number | null;
  fatGMin: number;
  choGMin: number;
  choShare: number;
  rer: number;
  kcalMin: number;
}

export interface FuelChartProps {
  rows: Row[];
  crossover: Row | null;
  maxFat: (Row & { vo2PctPeak: number | null }) | null;
  warnings: string[];
}

function intensity(r: Row): string {
  const parts: string[] = [];
  if (r.powerW != null) parts.push(`${Math.round(r.powerW)} W`);
  if (r.speedKmh != null) parts.push(`${r.speedKmh.toFixed(1)} km/h`);
  if (r.hrBpm != null) parts.push(`${Math.round(r.hrBpm)} bpm`);
  parts.push(`VO2 ${Math.round(r.vo2MlMin)} mL/min`);
  return parts.join(" · ");
}

export function FuelChart({ rows, crossover, maxFat, warnings }: FuelChartProps) {
  const byPower = rows.every((r) => r.powerW != null);
  const bySpeed = !byPower && rows.every((r) => r.speedKmh != null);
  const x = (r: Row) => (byPower ? r.powerW! : bySpeed ? r.speedKmh! : r.vo2MlMin);
  const xLabel = byPower ? "Power (W)" : bySpeed ? "Speed (km/h)" : "VO2 (mL/min)";
  const markers = [
    ...(crossover ? [{ id: "crossover", label: "Cross", x: x(crossover), color: "#c8942c" }] : []),
    ...(maxFat ? [{ id: "fatmax", label: "Fat max", x: x(maxFat), color: "#0f5e63" }] : []),
  ];
  return (
    <div className="space-y-3">
      <div className="grid gap-6 lg:grid-cols-2">
        <ScatterChart
          title="Fat and carbohydrate oxidation (Frayn 1983)"
          xLabel={xLabel}
          yLabel="Oxidation (g/min)"
          series={[
            { label: "Fat (g/min)", kind: "line", points: rows.map((r) => [x(r), r.fatGMin]), color: "#0f5e63" },
            {
              label: "Carbohydrate (g/min)",
              kind: "line",
              points: rows.map((r) => [x(r), r.choGMin]),
              color: "#c8942c",
              dash: true,
            },
          ]}
          markers={markers}
          xFormat={(v) => v.toFixed(0)}
          yFormat={(v) => v.toFixed(1)}
        />
        <ScatterChart
          title="Share of energy from carbohydrate (non-protein RQ)"
          xLabel={xLabel}
          yLabel="Carbohydrate share (%)"
          series={[
            {
              label: "Carbohydrate share of energy (%)",
              kind: "line",
              points: rows.map((r) => [x(r), r.choShare * 100]),
              color: "#4a1d45",
            },
          ]}
          markers={markers}
          xFormat={(v) => v.toFixed(0)}
          yFormat={(v) => v.toFixed(0)}
        />
      </div>
      <dl className="grid gap-2 text-sm sm:grid-cols-2">
        <div>
          <dt className="font-semibold">Crossover (carbohydrate supplies more energy than fat)</dt>
          <dd className="num">
            {crossover ? `${intensity(crossover)} · RER ${crossover.rer.toFixed(2)}` : "not reached in this test"}
          </dd>
        </div>
        <div>
          <dt className="font-semibold">Maximal fat oxidation</dt>
          <dd className="num">
            {maxFat
              ? `${maxFat.fatGMin.toFixed(2)} g/min at ${intensity(maxFat)}${maxFat.vo2PctPeak ? ` (${Math.round(maxFat.vo2PctPeak)} % of peak VO2)` : ""}`
              : "no fat oxidation measured"}
          </dd>
        </div>
      </dl>
      {warnings.map((w) => (
        <p key={w} className="text-xs text-ink-soft">
          {w}
        </p>
      ))}
      <p className="text-xs text-ink-soft">
        Rates from Frayn 1983 (protein neglected), energy from Weir 1949, shares from the non-protein RQ table. A ramp
        test does not reach steady state, so these are estimates; a step test with 3–4-minute stages is more precise.
      </p>
    </div>
  );
}
