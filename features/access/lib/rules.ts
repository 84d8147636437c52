/**
 * Who may do what, as pure rules. The server loads the memberships and calls these; nothing else decides access.
 * An athlete is a user with an athlete membership; the athlete's id is the user's id.
 */
export type SquadRole = "head_coach" | "coach" | "athlete";

export interface Membership {
  squadId: string;
  role: SquadRole;
}

export interface Actor {
  userId: string;
  isAdmin: boolean;
  memberships: Membership[];
}

export interface AthleteTarget {
  userId: string;
  memberships: Membership[];
}

const COACHING: ReadonlySet<SquadRole> = new Set(["head_coach", "coach"]);

export function isCoachOf(actor: Actor, squadId: string): boolean {
  return actor.memberships.some((m) => m.squadId === squadId && COACHING.has(m.role));
}

export function isHeadCoachOf(actor: Actor, squadId: string): boolean {
  return actor.memberships.some((m) => m.squadId === squadId && m.role === "head_coach");
}

export function isMemberOf(actor: Actor, squadId: string): boolean {
  return actor.memberships.some((m) => m.squadId === squadId);
}

/** The squads in which the target is an athlete. */
function athleteSquads(target: AthleteTarget): string[] {
  return target.memberships.filter((m) => m.role === "athlete").map((m) => m.squadId);
}

/** See an athlete's profile, zones, plan and history: the athlete, or a coach of a squad the athlete belongs to. */
export function canViewAthlete(actor: Actor, target: AthleteTarget): boolean {
  if (actor.userId === target.userId) return true;
  return athleteSquads(target).some((squadId) => isCoachOf(actor, squadId));
}

/** Edit an athlete's profile and own records: the athlete, or a coach of a squad the athlete belongs to. */
export function canEditAthlete(actor: Actor, target: AthleteTarget): boolean {
  return canViewAthlete(actor, target);
}

/** Coach an athlete — record tests, set zones, plan sessions: a coach of a squad the athlete belongs to, not the athlete. */
export function canCoachAthlete(actor: Actor, target: AthleteTarget): boolean {
  return athleteSquads(target).some((squadId) => isCoachOf(actor, squadId));
}

/** See the roster of a squad: its coaches. */
export function canViewRoster(actor: Actor, squadId: string): boolean {
  return isCoachOf(actor, squadId);
}

/** Invite into a squad or remove members: its head coach. */
export function canManageSquad(actor: Actor, squadId: string): boolean {
  return isHeadCoachOf(actor, squadId);
}

/** Operate the site (users and squads, no training data). */
export function canOperateSite(actor: Actor): boolean {
  return actor.isAdmin;
}

/** The squad ids whose athletes the actor may see as a coach. */
export function coachedSquadIds(actor: Actor): string[] {
  return actor.memberships.filter((m) => COACHING.has(m.role)).map((m) => m.squadId);
}
