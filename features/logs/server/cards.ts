import "server-only";
import type { Actor } from "@/features/access/lib/rules";
import { listSessions } from "@/features/planning/server";
import type { SessionCardData } from "../components/SessionCard";
import { listLogs } from "./logs";

/** Planned sessions of a date range with their logs, ready for session cards; also the unplanned logs of the range. */
export async function sessionCards(actor: Actor, athleteId: string, from: string, to: string) {
  const [sessions, logs] = await Promise.all([
    listSessions(actor, athleteId, from, to),
    listLogs(actor, athleteId, from, to),
  ]);
  const byPlanned = new Map(logs.filter((l) => l.plannedSessionId).map((l) => [l.plannedSessionId!, l]));
  const cards: SessionCardData[] = sessions.map((s) => {
    const l = byPlanned.get(s.id);
    return {
      id: s.id,
      athleteId,
      date: s.date,
      title: s.title,
      sport: s.sport,
      kind: s.kind,
      totalS: s.totalS,
      notes: s.notes,
      structure: s.structure,
      zoneSet: s.zoneSet,
      compliance: s.log?.compliance ?? 0,
      log: l
        ? {
            id: l.id,
            status: l.status,
            durationMin: l.durationMin,
            distanceKm: l.distanceKm,
            rpe: l.rpe,
            notes: l.notes,
            skipReason: l.skipReason,
            measuredMinByZone: l.measuredMinByZone,
            zoneMeasure: l.zoneMeasure,
            editable: Date.parse(l.editableUntil) > Date.now(),
            hasFile: !!l.file,
          }
        : null,
    };
  });
  return { cards, unplanned: logs.filter((l) => !l.plannedSessionId) };
}
