import Link from "next/link";
import { Day } from "@/features/platform/components/dates";
import { SPORT_LABELS } from "@/features/platform/lib/sports";
import { ZoneTable } from "@/features/zones/components/ZoneTable";
import type { TestView } from "../lib/views";
import { STOP_SIGNS } from "../schemas";
import { FuelChart, type FuelChartProps } from "./FuelChart";
import { mmss } from "@/features/platform/lib/format";
import { GasExchangeResult, type GasExchangeResultProps } from "./GasExchangeResult";
import { SegmentEditor, type SegmentEditorProps } from "./SegmentEditor";
import type { Units } from "@/features/platform/lib/units";

export const KIND_LABELS = {
  gas_exchange: "Gas-exchange test",
  talk: "Talk test",
  submax: "Submaximal estimate",
  manual: "Thresholds entered by hand",
} as const;
const ENDED = { exhaustion: "by exhaustion", plan: "as planned", stop_sign: "by a stop sign" } as const;
const SPEECH = {
  comfortable: "comfortable",
  not_fully_comfortable: "not fully comfortable",
  cannot_speak: "cannot speak comfortably",
} as Record<string, string>;

type R = Record<string, unknown>;

export function TestHeader({ test }: { test: TestView }) {
  const stop = STOP_SIGNS.find((s) => s.id === test.stopSign)?.text;
  return (
    <div>
      <p className="text-sm font-semibold uppercase tracking-widest text-tide">
        <Link href={`/athletes/${test.athleteId}`} className="hover:underline">
          {test.athleteName}
        </Link>
      </p>
      <h1 className="text-2xl font-bold">
        {KIND_LABELS[test.kind]} · <Day value={test.date} />
      </h1>
      <p className="text-sm text-ink-soft">
        {(SPORT_LABELS as Record<string, string>)[test.sport] ?? test.sport} · {test.protocol} · ended{" "}
        {ENDED[test.endedBy]}
        {stop ? `: ${stop}` : ""}
        {test.bodyMassKg ? ` · body mass ${test.bodyMassKg} kg` : ""}
      </p>
      {test.adjustedAt ? (
        <p className="text-sm text-ink-soft">
          Thresholds adjusted by {test.adjustedBy ?? "a coach"} on{" "}
          <Day value={new Date(test.adjustedAt).toISOString().slice(0, 10)} />{" "}
          {new Date(test.adjustedAt).toISOString().slice(11, 16)} UTC; the detected values are kept.
        </p>
      ) : null}
    </div>
  );
}

export function TestBody({
  test,
  canEdit,
  interactive = true,
  units = "metric",
  maxHrBpm,
}: {
  test: TestView;
  canEdit: boolean;
  interactive?: boolean;
  /** The reader's units, for the zone tables. */
  units?: Units;
  /** The athlete's maximal heart rate, for zone 1's shown lower end. */
  maxHrBpm?: number | null;
}) {
  const r = test.result as R;
  return (
    <div className="space-y-6">
      {test.kind === "gas_exchange" ? <GasBody test={test} canEdit={canEdit} interactive={interactive} /> : null}
      {test.kind === "talk" ? <TalkBody result={r} input={test.input as R} /> : null}
      {test.kind === "submax" ? <SubmaxBody result={r} /> : null}
      {test.kind === "manual" ? (
        <p className="text-sm">Thresholds entered by hand: VT1 and VT2 as given below in the zone table.</p>
      ) : null}
      <section className="card" aria-labelledby="zones-h">
        <h2 id="zones-h" className="mb-3 text-lg font-bold">
          Zones from this test
        </h2>
        {test.zoneSet ? (
          <div className="space-y-4">
            <ZoneTable
              zones={test.zoneSet.zones}
              sport={test.sport}
              units={units}
              maxHrBpm={maxHrBpm}
              caption={
                <>
                  Effective from <Day value={test.zoneSet.effectiveFrom} /> · {test.zoneSet.source}
                </>
              }
            />
            {test.zoneSet.fiveZones ? (
              <ZoneTable
                zones={test.zoneSet.fiveZones}
                sport={test.sport}
                units={units}
                maxHrBpm={maxHrBpm}
                caption="Five-zone subdivision"
              />
            ) : null}
          </div>
        ) : (
          <p className="text-ink-soft">
            {test.kind === "submax"
              ? "A submaximal estimate gives VO2max, not thresholds, so it makes no zones."
              : "No zones: VT1 and VT2 are both needed. Set the missing threshold on the charts and save."}
          </p>
        )}
      </section>
    </div>
  );
}

function GasBody({ test, canEdit, interactive }: { test: TestView; canEdit: boolean; interactive: boolean }) {
  const r = test.result as R;
  const peak = r.peak as {
    vo2MlMin: number;
    vo2MlKgMin: number | null;
    hrBpm: number | null;
    rer: number | null;
    powerW: number | null;
    speedKmh: number | null;
    plateau: boolean;
  };
  const props: GasExchangeResultProps = {
    testId: test.id,
    rows: r.points as GasExchangeResultProps["rows"],
    onsetS: Number(r.onsetS),
    endS: Number(r.endS),
    bodyMassKg: test.bodyMassKg,
    detected: test.detected,
    adjusted: test.adjusted,
    details: {
      vt1: r.vt1Detail as GasExchangeResultProps["details"]["vt1"],
      vt2: r.vt2Detail as GasExchangeResultProps["details"]["vt2"],
      vt1Reason: (r.vt1Reason as string) ?? null,
      vt2Reason: (r.vt2Reason as string) ?? null,
    },
    canEdit,
    interactive,
  };
  const warnings = (r.warnings as string[]) ?? [];
  return (
    <>
      <section className="card" aria-labelledby="peak-h">
        <h2 id="peak-h" className="mb-2 text-lg font-bold">
          Peak values
        </h2>
        <dl className="grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:grid-cols-4">
          <div>
            <dt className="text-ink-soft">Peak VO2 (30-s mean)</dt>
            <dd className="num font-semibold">
              {peak.vo2MlMin} mL/min{peak.vo2MlKgMin ? ` · ${peak.vo2MlKgMin} mL/kg/min` : ""}
            </dd>
          </div>
          <div>
            <dt className="text-ink-soft">Peak heart rate</dt>
            <dd className="num font-semibold">{peak.hrBpm !== null ? `${peak.hrBpm} bpm` : "not recorded"}</dd>
          </div>
          <div>
            <dt className="text-ink-soft">Peak RER</dt>
            <dd className="num font-semibold">{peak.rer ?? "—"}</dd>
          </div>
          <div>
            <dt className="text-ink-soft">VO2 plateau</dt>
            <dd className="font-semibold">{peak.plateau ? "yes (under 150 mL/min rise in the last minute)" : "no"}</dd>
          </div>
          {peak.powerW !== null ? (
            <div>
              <dt className="text-ink-soft">Peak power</dt>
              <dd className="num font-semibold">{peak.powerW} W</dd>
            </div>
          ) : null}
          {peak.speedKmh !== null ? (
            <div>
              <dt className="text-ink-soft">Peak speed</dt>
              <dd className="num font-semibold">{peak.speedKmh} km/h</dd>
            </div>
          ) : null}
          <div>
            <dt className="text-ink-soft">Exercise analysed</dt>
            <dd className="num font-semibold">
              {mmss(Number(r.onsetS))}–{mmss(Number(r.endS))} min:s
            </dd>
          </div>
          <div>
            <dt className="text-ink-soft">Breaths</dt>
            <dd className="num font-semibold">
              {String(r.breathsRead)} read, {String(r.breathsRemoved)} removed
            </dd>
          </div>
        </dl>
        {warnings.length ? (
          <ul className="mt-3 list-disc space-y-1 pl-5 text-sm" aria-label="Warnings">
            {warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        ) : null}
      </section>
      {interactive ? (
        <SegmentEditor
          // A new analysis (another segment) starts the handles afresh from the stored result.
          key={`${String(r.onsetS)}-${String(r.endS)}-${String(r.segmentSource)}`}
          testId={test.id}
          rows={r.points as SegmentEditorProps["rows"]}
          onsetS={Number(r.onsetS)}
          endS={Number(r.endS)}
          source={(r.segmentSource as SegmentEditorProps["source"]) ?? "workload"}
          canEdit={canEdit}
        />
      ) : null}
      <section aria-labelledby="thr-h" className="space-y-3">
        <h2 id="thr-h" className="text-lg font-bold">
          Thresholds
        </h2>
        <GasExchangeResult key={`${String(r.onsetS)}-${String(r.endS)}-${JSON.stringify(test.detected)}`} {...props} />
      </section>
      {test.fuel && test.fuel.rows.length ? (
        <section className="card" aria-labelledby="fuel-h">
          <h2 id="fuel-h" className="mb-3 text-lg font-bold">
            Fuel use
          </h2>
          <FuelChart {...(test.fuel as unknown as FuelChartProps)} />
        </section>
      ) : null}
    </>
  );
}

function TalkBody({ result, input }: { result: R; input: R }) {
  const talk = input.talk as {
    workloadUnit: string;
    stages: { workload: number; durationS: number; hrBpm: number; speech: string }[];
  };
  const th = (t: unknown) => t as { stage: number; workload: number; workloadUnit: string; hrBpm: number } | null;
  const vt1 = th(result.vt1),
    vt2 = th(result.vt2);
  return (
    <section className="card space-y-3" aria-labelledby="talk-h">
      <h2 id="talk-h" className="text-lg font-bold">
        Talk test (Persinger, Foster et al. 2004)
      </h2>
      <dl className="grid gap-2 text-sm sm:grid-cols-2">
        <div>
          <dt className="font-semibold">VT1 — first stage where speech was not comfortable</dt>
          <dd className="num">
            {vt1
              ? `stage ${vt1.stage}: ${vt1.workload} ${vt1.workloadUnit}, ${vt1.hrBpm} bpm`
              : String(result.vt1Reason)}
          </dd>
        </div>
        <div>
          <dt className="font-semibold">VT2 — first stage where speaking was impossible</dt>
          <dd className="num">
            {vt2
              ? `stage ${vt2.stage}: ${vt2.workload} ${vt2.workloadUnit}, ${vt2.hrBpm} bpm`
              : String(result.vt2Reason)}
          </dd>
        </div>
      </dl>
      <table className="w-full text-left text-sm">
        <thead>
          <tr className="border-b border-rule text-ink-soft">
            <th scope="col" className="py-1">
              Stage
            </th>
            <th scope="col">Workload ({talk.workloadUnit})</th>
            <th scope="col">Duration (min:s)</th>
            <th scope="col">Heart rate (bpm)</th>
            <th scope="col">Speech</th>
          </tr>
        </thead>
        <tbody>
          {talk.stages.map((s, i) => (
            <tr key={i} className="border-b border-rule/60">
              <td className="num py-1">{i + 1}</td>
              <td className="num">{s.workload}</td>
              <td className="num">{mmss(s.durationS)}</td>
              <td className="num">{s.hrBpm}</td>
              <td>{SPEECH[s.speech]}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {((result.warnings as string[]) ?? []).map((w) => (
        <p key={w} className="text-sm" role="note">
          {w}
        </p>
      ))}
    </section>
  );
}

function SubmaxBody({ result }: { result: R }) {
  const band = result.band as [number, number] | null;
  return (
    <section className="card space-y-2" aria-labelledby="submax-h">
      <h2 id="submax-h" className="text-lg font-bold">
        Estimated VO2max
      </h2>
      {result.vo2MaxMlKgMin !== null ? (
        <p className="text-3xl font-bold num">
          {String(result.vo2MaxMlKgMin)} <span className="text-base font-normal">mL/kg/min</span>
        </p>
      ) : (
        <p role="alert">{String(result.reason)}</p>
      )}
      {band ? (
        <p className="num">
          Likely range {band[0]}–{band[1]} mL/kg/min (typical error about ±15 %).
        </p>
      ) : null}
      <p className="text-sm">
        Maximal heart rate used: <span className="num">{String(result.hrMaxBpm)} bpm</span> (
        {String(result.hrMaxSource)}). Stage VO2 from the ACSM metabolic equations:{" "}
        <span className="num">{(result.stageVo2MlKgMin as number[]).join(", ")} mL/kg/min</span>.
      </p>
      <p className="text-sm text-ink-soft">{String(result.caveat)}</p>
      {((result.warnings as string[]) ?? []).map((w) => (
        <p key={w} className="text-sm">
          {w}
        </p>
      ))}
    </section>
  );
}
