/**
 * Readiness before testing and hard training, from the latest screening answers and the clearances recorded after them.
 *
 * The questions are our own wording of the usual topics of pre-participation screening (the PAR-Q+ and the ACSM
 * pre-participation screening algorithm: Riebe et al. 2015, Med Sci Sports Exerc 47:2473–2479; Warburton et al. 2011,
 * Health Fit J Can 4:3–23). What an answer does is the product's rule, deliberately stricter than "at the coach's judgement":
 *
 * - symptom ("yes" to chest pain, fainting or dizziness, breathlessness or palpitations at rest or on mild effort): every test
 *   is blocked and hard sessions are held until a clearance is recorded after that answer (ACSM: symptoms → stop and seek
 *   medical clearance before exercise continues);
 * - recent illness (fever or illness in the past two weeks): the same hold, lifted by new answers once well, or a clearance;
 * - a known condition, pregnancy, a recent injury or operation, regular medication, or another reason: maximal tests wait for
 *   a clearance; submaximal and field tests are at the coach's judgement;
 * - heart-rate-lowering medicine: as a condition, and a caution on heart-rate zones and TRIMP (heart rate under such medicine
 *   does not track effort as usual), with power, pace or RPE suggested instead.
 *
 * Answers are valid for 12 months (common practice: re-screen yearly), and are answered again on any change the athlete
 * reports. Tidemark is not a medical device: a clearance is recorded as the coach types it, not verified.
 */

import { addDays } from "@/features/platform/lib/days";

export type QuestionKind = "symptom" | "illness" | "condition" | "hr_medication";

export const SCREENING_QUESTIONS = [
  {
    id: "chest_pain",
    kind: "symptom",
    text: "Do you get chest pain, pressure or tightness at rest, in daily life or when you exercise?",
  },
  {
    id: "dizziness",
    kind: "symptom",
    text: "Have you fainted, lost consciousness, or lost your balance from dizziness in the past year?",
  },
  {
    id: "breathless",
    kind: "symptom",
    text: "Do you get unusually short of breath, or feel your heart racing or skipping, at rest or on mild effort?",
  },
  {
    id: "recent_illness",
    kind: "illness",
    text: "Have you had a fever, a chest infection or another illness in the past two weeks, or do you feel unwell today?",
  },
  {
    id: "heart",
    kind: "condition",
    text: "Has a doctor ever said you have a heart condition, or that you should exercise only under medical supervision?",
  },
  { id: "blood_pressure", kind: "condition", text: "Do you have high blood pressure, treated or not?" },
  {
    id: "chronic_disease",
    kind: "condition",
    text: "Do you have diabetes, a lung disease (such as asthma or COPD), a kidney disease or another long-term illness?",
  },
  {
    id: "family_history",
    kind: "condition",
    text: "Did a parent, brother or sister die suddenly of a heart problem before the age of 50?",
  },
  { id: "pregnancy", kind: "condition", text: "Are you pregnant, or have you given birth in the past six months?" },
  {
    id: "injury",
    kind: "condition",
    text: "Do you have a bone, joint or muscle problem that hard exercise could make worse, or have you been injured or operated on in the past six months?",
  },
  { id: "medication", kind: "condition", text: "Do you take any medicine regularly (prescribed or not)?" },
  {
    id: "hr_medication",
    kind: "hr_medication",
    text: "Do you take medicine that lowers the heart rate, such as a beta blocker (for blood pressure, the heart, migraine or anxiety)?",
  },
  {
    id: "other",
    kind: "condition",
    text: "Is there any other reason you should not take part in a hard exercise test or hard training?",
  },
] as const satisfies readonly { id: string; kind: QuestionKind; text: string }[];

export type ScreeningQuestionId = (typeof SCREENING_QUESTIONS)[number]["id"];

export const SCREENING_VALID_DAYS = 365;

export interface ReadinessInput {
  /** The latest answers, with when they were given (ISO instant). */
  latest: { answeredAt: string; answers: Record<string, boolean> } | null;
  /** Clearances, each with when it was recorded (ISO instant) and its details. */
  clearances: { recordedAt: string; clearedBy: string; role: string; clearedOn: string; note: string | null }[];
  /** The athlete's local calendar day. */
  today: string;
}

export type ReadinessStatus = "missing" | "incomplete" | "expired" | "hold" | "maximal_needs_clearance" | "ready";

export interface Readiness {
  status: ReadinessStatus;
  /** Hard sessions (zone 2 and 3 work) are on hold: shown on the roster, today and the plan. */
  holdHardSessions: boolean;
  /** Which tests may be recorded now. */
  tests: "none" | "submaximal" | "all";
  /** One line for the roster. */
  label: string;
  /** Why, in full sentences, and what to do. */
  reasons: string[];
  whatToDo: string | null;
  hrMedication: boolean;
  answeredOn: string | null;
  expiresOn: string | null;
  clearance: { clearedBy: string; role: string; clearedOn: string; note: string | null } | null;
}

const day = (iso: string) => iso.slice(0, 10);

export function readiness(input: ReadinessInput): Readiness {
  const base = { hrMedication: false, answeredOn: null, expiresOn: null, clearance: null } as const;
  if (!input.latest) {
    return {
      ...base,
      status: "missing",
      holdHardSessions: false,
      tests: "none",
      label: "Screening not answered",
      reasons: ["The readiness questions have not been answered yet."],
      whatToDo: "Answer the readiness questions before any test.",
    };
  }
  const answeredOn = day(input.latest.answeredAt);
  const expiresOn = addDays(answeredOn, SCREENING_VALID_DAYS);
  const answers = input.latest.answers;
  const hrMedication = answers.hr_medication === true;
  const common = { hrMedication, answeredOn, expiresOn };
  if (SCREENING_QUESTIONS.some((q) => typeof answers[q.id] !== "boolean")) {
    return {
      ...common,
      clearance: null,
      status: "incomplete",
      holdHardSessions: false,
      tests: "none",
      label: "Screening to answer again",
      reasons: ["The readiness questions have changed since they were last answered."],
      whatToDo: "Answer the readiness questions again before any test.",
    };
  }
  if (expiresOn <= input.today) {
    return {
      ...common,
      clearance: null,
      status: "expired",
      holdHardSessions: false,
      tests: "none",
      label: `Screening expired ${expiresOn}`,
      reasons: [`The readiness answers are from ${answeredOn}, more than 12 months ago.`],
      whatToDo: "Answer the readiness questions again before any test.",
    };
  }
  const clearance =
    input.clearances
      .filter((c) => c.recordedAt >= input.latest!.answeredAt)
      .sort((a, b) => (a.recordedAt < b.recordedAt ? 1 : -1))[0] ?? null;
  const cleared = clearance
    ? { clearedBy: clearance.clearedBy, role: clearance.role, clearedOn: clearance.clearedOn, note: clearance.note }
    : null;
  const yes = SCREENING_QUESTIONS.filter((q) => answers[q.id] === true);
  const symptoms = yes.filter((q) => q.kind === "symptom");
  const illness = yes.filter((q) => q.kind === "illness");
  const conditions = yes.filter((q) => q.kind === "condition" || q.kind === "hr_medication");
  const reasons = yes.map((q) => `Yes: ${q.text}`);
  if (hrMedication)
    reasons.push(
      "Heart rate under heart-rate-lowering medicine does not track effort as usual: heart-rate zones and TRIMP are unreliable; use power, pace or RPE targets.",
    );
  if ((symptoms.length || illness.length) && !cleared) {
    return {
      ...common,
      clearance: null,
      status: "hold",
      holdHardSessions: true,
      tests: "none",
      label: symptoms.length ? "Hold hard sessions: symptom reported" : "Hold hard sessions: recent illness",
      reasons,
      whatToDo: symptoms.length
        ? "Stop testing and hard sessions. The athlete should see a physician (or another licensed health professional) before training hard again; when they are cleared, a coach records the clearance: who cleared, their role, the date."
        : "No testing or hard sessions until the athlete is well: they answer the questions again when recovered, or a coach records a clearance.",
    };
  }
  if (conditions.length && !cleared) {
    return {
      ...common,
      clearance: null,
      status: "maximal_needs_clearance",
      holdHardSessions: false,
      tests: "submaximal",
      label: "Maximal tests need clearance",
      reasons,
      whatToDo:
        "A maximal test waits for a clearance from a physician or another licensed health professional, recorded by a coach. A submaximal or field test is at the coach's judgement.",
    };
  }
  return {
    ...common,
    clearance: cleared,
    status: "ready",
    holdHardSessions: false,
    tests: "all",
    label: cleared ? `Cleared by ${cleared.clearedBy} (${cleared.role}), ${cleared.clearedOn}` : "Screening valid",
    reasons,
    whatToDo: null,
  };
}

/** Test kinds and what readiness they need: a gas-exchange ramp runs to exhaustion (maximal). */
export function testAllowed(r: Readiness, kind: "gas_exchange" | "talk" | "submax" | "manual"): boolean {
  if (r.tests === "all") return true;
  if (r.tests === "none") return false;
  return kind !== "gas_exchange";
}
