import { Day } from "@/features/platform/components/dates";
import { SPORT_LABELS } from "@/features/platform/lib/sports";
import type { Block } from "@/features/planning/lib/session";
import { targetText } from "@/features/zones/lib/format";
import { withShownFloor, type Zone } from "@/features/zones/lib/zones";
import { distanceText, type Units } from "@/features/platform/lib/units";
import { LogPanel, type LogView } from "./LogPanel";
import { ThreadPanel } from "@/features/threads/components/ThreadPanel";

const KIND: Record<string, string> = { warmup: "Warm-up", work: "Work", recovery: "Recovery", cooldown: "Cool-down" };
const SWATCH = ["bg-zone-1", "bg-zone-2", "bg-zone-3"];

function amount(s: Extract<Block, { type: "step" }>, units: Units, sport: string): string {
  if (s.durationS !== undefined)
    return s.durationS % 60 === 0
      ? `${s.durationS / 60} min`
      : `${Math.floor(s.durationS / 60)} min ${s.durationS % 60} s`;
  return distanceText(s.distanceM!, units, sport);
}

const sportName = (sport: string) => ((SPORT_LABELS as Record<string, string>)[sport] ?? sport).toLowerCase();

function Steps({
  blocks,
  zones,
  sport,
  units,
}: {
  blocks: Block[];
  zones: Zone[] | null;
  sport: string;
  units: Units;
}) {
  return (
    <ol className="space-y-1">
      {blocks.map((b, i) =>
        b.type === "repeat" ? (
          <li key={i} className="rounded border border-rule/70 p-2">
            <p className="text-sm font-semibold">{b.times} ×</p>
            <Steps blocks={b.steps} zones={zones} sport={sport} units={units} />
          </li>
        ) : (
          <li key={i} className="flex flex-wrap items-baseline gap-x-2 text-sm">
            <span aria-hidden className={`inline-block h-3 w-3 rounded-sm border border-ink ${SWATCH[b.zone - 1]}`} />
            <span className="font-semibold">{KIND[b.kind]}</span>
            <span className="num">{amount(b, units, sport)}</span>
            <span>zone {b.zone}</span>
            <span className="num text-ink-soft">
              {zones
                ? (targetText(zones[b.zone - 1], sport, units) ?? "no numbers in the zone set")
                : "no zone set yet"}
            </span>
          </li>
        ),
      )}
    </ol>
  );
}

export interface SessionCardData {
  id: string;
  athleteId: string;
  date: string;
  title: string;
  sport: string;
  kind: string;
  totalS: number;
  notes: string;
  structure: unknown[];
  /** `fromSport`: no zones of the session's sport yet, so heart rate from the nearest sport's zones. */
  zoneSet: { effectiveFrom: string; zones: Zone[]; fromSport?: string | null } | null;
  log: LogView | null;
  compliance: number;
}

/** A planned session with each step's target in the athlete's own numbers, how much of it was done, and its log. */
export function SessionCard({
  s,
  canLog,
  units = "metric",
  maxHrBpm,
}: {
  s: SessionCardData;
  canLog: boolean;
  /** The reader's units (platform/lib/units.ts). */
  units?: Units;
  /** The athlete's maximal heart rate: zone 1 targets read from its light-intensity floor. */
  maxHrBpm?: number | null;
}) {
  const plannedMin = s.totalS / 60;
  const fill = Math.min(1, s.compliance);
  return (
    <article className="card space-y-3" aria-label={`Session: ${s.title}`} data-testid="session-card">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-lg font-bold">
          {s.kind === "retest" ? "⟳ " : ""}
          {s.title}
        </h3>
        <p className="num text-sm text-ink-soft">
          {(SPORT_LABELS as Record<string, string>)[s.sport] ?? s.sport} · {Math.round(plannedMin)} min planned
        </p>
      </header>
      {s.notes ? <p className="text-sm">{s.notes}</p> : null}
      <Steps
        blocks={s.structure as Block[]}
        zones={s.zoneSet ? withShownFloor(s.zoneSet.zones, maxHrBpm) : null}
        sport={s.sport}
        units={units}
      />
      {s.zoneSet?.fromSport ? (
        <p className="text-xs text-ink-soft">
          No {sportName(s.sport)} zones yet: heart-rate targets from the {sportName(s.zoneSet.fromSport)} zones in force
          since {s.zoneSet.effectiveFrom}. Heart rate at the same effort differs a little between sports; a{" "}
          {sportName(s.sport)} test gives this sport its own zones.
        </p>
      ) : s.zoneSet ? (
        <p className="text-xs text-ink-soft">
          Targets from the zones in force since <Day value={s.zoneSet.effectiveFrom} />.
        </p>
      ) : null}
      {s.structure.length ? (
        <p className="text-sm">
          <a className="font-semibold text-tide underline" href={`/api/sessions/${s.id}/workout`} download>
            Put this session on your watch (.fit workout)
          </a>
        </p>
      ) : null}
      {s.log ? (
        <div>
          <p className="text-xs font-semibold text-ink-soft">
            Done: <span className="num">{Math.round(s.compliance * 100)} % of the planned time</span>
          </p>
          <div
            className="mt-1 h-2 overflow-hidden rounded bg-ground"
            role="meter"
            aria-label="Share of the planned time done"
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={Math.round(s.compliance * 100)}
          >
            <div className="h-full bg-ink/70" style={{ width: `${fill * 100}%` }} />
          </div>
        </div>
      ) : (
        <p className="text-xs font-semibold text-ink-soft">Not logged yet.</p>
      )}
      {canLog ? (
        <LogPanel sessionId={s.id} athleteId={s.athleteId} plannedMin={plannedMin} log={s.log} units={units} />
      ) : null}
      <ThreadPanel kind="session" id={s.id} />
    </article>
  );
}
