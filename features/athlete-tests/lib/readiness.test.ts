// The product's readiness rules (readiness.ts; topics after the PAR-Q+ and Riebe et al. 2015), case by case.
import { describe, expect, it } from "vitest";
import { readiness, SCREENING_QUESTIONS, testAllowed } from "./readiness";

const no = () => Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, false])) as Record<string, boolean>;
const at = (day: string) => `${day}T10:00:00.000Z`;
const clearance = (day: string) => ({ recordedAt: at(day), clearedBy: "Dr B", role: "GP", clearedOn: day, note: null });

describe("readiness", () => {
  it("all no within 12 months: every test, no hold", () => {
    const r = readiness({
      latest: { answeredAt: at("2026-01-10"), answers: no() },
      clearances: [],
      today: "2026-12-03",
    });
    expect(r).toMatchObject({ status: "ready", tests: "all", holdHardSessions: false, expiresOn: "2027-01-10" });
  });
  it("expires on the day 12 months on", () => {
    expect(
      readiness({ latest: { answeredAt: at("2025-12-03"), answers: no() }, clearances: [], today: "2026-12-03" })
        .status,
    ).toBe("expired");
    expect(
      readiness({ latest: { answeredAt: at("2025-12-04"), answers: no() }, clearances: [], today: "2026-12-03" })
        .status,
    ).toBe("ready");
  });
  it("a symptom holds hard sessions and every test; a clearance before the answers does not count, one after does", () => {
    const latest = { answeredAt: at("2026-11-01"), answers: { ...no(), breathless: true } };
    const held = readiness({ latest, clearances: [clearance("2026-10-01")], today: "2026-12-03" });
    expect(held).toMatchObject({ status: "hold", holdHardSessions: true, tests: "none" });
    for (const kind of ["gas_exchange", "talk", "submax", "manual"] as const)
      expect(testAllowed(held, kind)).toBe(false);
    expect(readiness({ latest, clearances: [clearance("2026-11-20")], today: "2026-12-03" })).toMatchObject({
      status: "ready",
      tests: "all",
    });
  });
  it("a recent illness holds until the answers say well again", () => {
    expect(
      readiness({
        latest: { answeredAt: at("2026-11-30"), answers: { ...no(), recent_illness: true } },
        clearances: [],
        today: "2026-12-03",
      }).holdHardSessions,
    ).toBe(true);
  });
  it("a condition: field tests yes, a maximal ramp no, until cleared", () => {
    const r = readiness({
      latest: { answeredAt: at("2026-11-01"), answers: { ...no(), blood_pressure: true } },
      clearances: [],
      today: "2026-12-03",
    });
    expect(r.status).toBe("maximal_needs_clearance");
    expect(testAllowed(r, "talk")).toBe(true);
    expect(testAllowed(r, "gas_exchange")).toBe(false);
  });
  it("missing and incomplete answers allow no test", () => {
    expect(readiness({ latest: null, clearances: [], today: "2026-12-03" }).tests).toBe("none");
    expect(
      readiness({
        latest: { answeredAt: at("2026-11-01"), answers: { heart: false } },
        clearances: [],
        today: "2026-12-03",
      }).status,
    ).toBe("incomplete");
  });
});
