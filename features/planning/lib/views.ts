/**
 * What the planning server functions answer with: plain objects with the fields screens and the API use, never whole
 * database rows (no author ids or bookkeeping timestamps). The mappers are the only place a row becomes one of these.
 */
import type { SeasonInput, SeasonWeek } from "./season";
import type { Block } from "./session";

type Zones = [number, number, number];
type SeasonEvent = SeasonInput["events"][number];
type SeasonLevel = NonNullable<SeasonInput["level"]>;

export interface TemplateView {
  id: string;
  squadId: string;
  name: string;
  sport: string;
  description: string;
  structure: Block[];
  totalS: number;
  minutesByZone: Zones;
  /** Edit counter: sent back with a change, so that a change on an older version answers 409. */
  version: number;
}

export interface SeasonView {
  id: string;
  athleteId: string;
  name: string;
  sport: string;
  startDate: string;
  events: SeasonEvent[];
  weeklyHours: number;
  level: SeasonLevel;
  retestEveryWeeks: number;
  weeks: SeasonWeek[];
  version: number;
}

export interface PlannedSessionView {
  id: string;
  athleteId: string;
  date: string;
  kind: string;
  sport: string;
  title: string;
  templateId: string | null;
  structure: Block[];
  totalS: number;
  minutesByZone: Zones;
  seriesId: string | null;
  /** Moved or edited apart from its series. */
  detached: boolean;
  notes: string;
  version: number;
}

interface TemplateRow extends Omit<TemplateView, "structure" | "minutesByZone"> {
  structure: unknown;
  minutesByZone: number[];
}
interface SeasonRow extends Omit<SeasonView, "events" | "weeks" | "level"> {
  events: unknown;
  weeks: unknown;
  level: string;
}
interface SessionRow extends Omit<PlannedSessionView, "structure" | "minutesByZone"> {
  structure: unknown;
  minutesByZone: number[];
}

const zones = (m: number[]): Zones => [m[0] ?? 0, m[1] ?? 0, m[2] ?? 0];

export function templateView(r: TemplateRow): TemplateView {
  return {
    id: r.id,
    squadId: r.squadId,
    name: r.name,
    sport: r.sport,
    description: r.description,
    structure: r.structure as Block[],
    totalS: r.totalS,
    minutesByZone: zones(r.minutesByZone),
    version: r.version,
  };
}

export function seasonView(r: SeasonRow): SeasonView {
  return {
    id: r.id,
    athleteId: r.athleteId,
    name: r.name,
    sport: r.sport,
    startDate: r.startDate,
    events: r.events as SeasonEvent[],
    weeklyHours: r.weeklyHours,
    level: r.level as SeasonLevel,
    retestEveryWeeks: r.retestEveryWeeks,
    weeks: r.weeks as SeasonWeek[],
    version: r.version,
  };
}

export function plannedSessionView(r: SessionRow): PlannedSessionView {
  return {
    id: r.id,
    athleteId: r.athleteId,
    date: r.date,
    kind: r.kind,
    sport: r.sport,
    title: r.title,
    templateId: r.templateId,
    structure: r.structure as Block[],
    totalS: r.totalS,
    minutesByZone: zones(r.minutesByZone),
    seriesId: r.seriesId,
    detached: r.detached,
    notes: r.notes,
    version: r.version,
  };
}
