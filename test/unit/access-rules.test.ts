// Access rules, role by role, as PRODUCT.md's role table states them (the product's own specification).
import { describe, expect, it } from "vitest";
import {
  canCoachAthlete,
  canEditAthlete,
  canManageSquad,
  canOperateSite,
  canViewAthlete,
  canViewRoster,
  coachedSquadIds,
  type Actor,
  type AthleteTarget,
} from "@/features/access/lib/rules";

const athleteA: AthleteTarget = { userId: "a", memberships: [{ squadId: "s1", role: "athlete" }] };
const actors: Record<string, Actor> = {
  anonymousLike: { userId: "nobody", isAdmin: false, memberships: [] },
  athleteA: { userId: "a", isAdmin: false, memberships: [{ squadId: "s1", role: "athlete" }] },
  athleteB: { userId: "b", isAdmin: false, memberships: [{ squadId: "s1", role: "athlete" }] },
  headCoach: { userId: "h", isAdmin: false, memberships: [{ squadId: "s1", role: "head_coach" }] },
  coach: { userId: "c", isAdmin: false, memberships: [{ squadId: "s1", role: "coach" }] },
  otherCoach: { userId: "o", isAdmin: false, memberships: [{ squadId: "s2", role: "head_coach" }] },
  admin: { userId: "x", isAdmin: true, memberships: [] },
};

describe("who may see and edit athlete A (squad s1)", () => {
  const expected: Record<string, { view: boolean; edit: boolean }> = {
    anonymousLike: { view: false, edit: false },
    athleteA: { view: true, edit: true },
    athleteB: { view: false, edit: false },
    headCoach: { view: true, edit: true },
    coach: { view: true, edit: true },
    otherCoach: { view: false, edit: false },
    admin: { view: false, edit: false }, // operators get no training data
  };
  for (const [name, want] of Object.entries(expected)) {
    it(`${name}: view ${want.view}, edit ${want.edit}`, () => {
      expect(canViewAthlete(actors[name]!, athleteA)).toBe(want.view);
      expect(canEditAthlete(actors[name]!, athleteA)).toBe(want.edit);
    });
  }

  it("a coach of s1 does not reach an athlete who left s1 for another squad", () => {
    const moved: AthleteTarget = { userId: "a", memberships: [{ squadId: "s2", role: "athlete" }] };
    expect(canViewAthlete(actors.coach!, moved)).toBe(false);
    expect(canViewAthlete(actors.otherCoach!, moved)).toBe(true);
  });

  it("being a coach in the athlete's squad counts only when the athlete is an athlete there", () => {
    const coachOnly: AthleteTarget = { userId: "z", memberships: [{ squadId: "s1", role: "coach" }] };
    expect(canViewAthlete(actors.headCoach!, coachOnly)).toBe(false);
  });
});

describe("squad rules", () => {
  it("the roster is for the squad's coaches", () => {
    expect(canViewRoster(actors.headCoach!, "s1")).toBe(true);
    expect(canViewRoster(actors.coach!, "s1")).toBe(true);
    expect(canViewRoster(actors.athleteA!, "s1")).toBe(false);
    expect(canViewRoster(actors.otherCoach!, "s1")).toBe(false);
    expect(canViewRoster(actors.admin!, "s1")).toBe(false);
  });

  it("only the head coach manages (invites, removes)", () => {
    expect(canManageSquad(actors.headCoach!, "s1")).toBe(true);
    expect(canManageSquad(actors.coach!, "s1")).toBe(false);
    expect(canManageSquad(actors.athleteA!, "s1")).toBe(false);
    expect(canManageSquad(actors.otherCoach!, "s1")).toBe(false);
  });

  it("only admins operate the site", () => {
    expect(canOperateSite(actors.admin!)).toBe(true);
    expect(canOperateSite(actors.headCoach!)).toBe(false);
  });

  it("coached squads leave out squads where the actor is an athlete", () => {
    const both: Actor = {
      userId: "m",
      isAdmin: false,
      memberships: [
        { squadId: "s1", role: "coach" },
        { squadId: "s3", role: "athlete" },
      ],
    };
    expect(coachedSquadIds(both)).toEqual(["s1"]);
  });
});

describe("coaching an athlete (tests, zones, plans)", () => {
  it("is for the athlete's coaches, not the athlete, other athletes or outsiders", () => {
    expect(canCoachAthlete(actors.headCoach!, athleteA)).toBe(true);
    expect(canCoachAthlete(actors.coach!, athleteA)).toBe(true);
    expect(canCoachAthlete(actors.athleteA!, athleteA)).toBe(false);
    expect(canCoachAthlete(actors.athleteB!, athleteA)).toBe(false);
    expect(canCoachAthlete(actors.otherCoach!, athleteA)).toBe(false);
    expect(canCoachAthlete(actors.admin!, athleteA)).toBe(false);
  });
});
