// The authorization matrix: every route handler, found from the files under app/api (a new route without an entry here
// fails this test), called as anonymous, athlete A, athlete B of the same squad, the head coach of A's squad, the coach of
// another squad and a site admin. The expected answer of every cell is written below; "ok" cells must succeed, every other
// cell must be refused (401 anonymous, 403 or 404 otherwise) and refusals must carry no data. Source: the roles table of
// the product brief (athletes see only their own data; coaches only their squads' athletes; admins no training data).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { resetConfig } from "@/features/platform/server/config";
import { encodeFit } from "@/features/activities/lib/fit-fixture";
import { SCREENING_QUESTIONS } from "@/features/athlete-tests/lib/readiness";
import { unsubscribeToken } from "@/features/messages/lib/unsubscribe";
import { syntheticRamp } from "@/features/gas-exchange/lib/synthetic-ramp";
import { startFakeEmail, type FakeEmail } from "../../scripts/fake-email";
import { Browser } from "../support/api";
import { query, resetDatabase } from "../support/db";
import { makeSquad } from "../support/squad";

type Who = "anonymous" | "athleteA" | "athleteB" | "coach" | "otherCoach" | "admin";
const WHO: Who[] = ["anonymous", "athleteA", "athleteB", "coach", "otherCoach", "admin"];
type Module = Record<string, unknown>;
type Ids = Record<string, string>;

interface Cell {
  /** Who succeeds; everyone else is refused. */
  ok: Who[];
  path: (ids: Ids) => string;
  params: (ids: Ids) => Record<string, string>;
  query?: (ids: Ids) => string;
  body?: (ids: Ids) => unknown;
  form?: (ids: Ids) => FormData;
  /** A fresh resource for each successful call of a route that uses it up (delete, accept…). */
  fresh?: (ids: Ids) => Promise<Ids>;
}

const modules = import.meta.glob<Module>("/app/api/**/route.ts", { eager: true });
const step = (kind: string, min: number, zone: number) => ({ type: "step", kind, durationS: min * 60, zone });
const SIGNED_IN: Who[] = ["athleteA", "athleteB", "coach", "otherCoach", "admin"];
const A_AND_COACH: Who[] = ["athleteA", "coach"];
const EVERYONE: Who[] = [...WHO];
const session = { date: "2027-04-06", title: "Matrix run", sport: "running", structure: [step("work", 40, 1)] };
const gasForm = () => {
  const f = new FormData();
  f.set("file", new File([syntheticRamp({ seed: 3 }).csv], "ramp.csv", { type: "text/csv" }));
  for (const [k, v] of Object.entries({
    sport: "cycling",
    protocol: "ramp 25 W/min",
    date: "2027-01-10",
    endedBy: "exhaustion",
  }))
    f.set(k, v);
  return f;
};

let s: Awaited<ReturnType<typeof makeSquad>>;
let other: Awaited<ReturnType<typeof makeSquad>>;
let admin: Browser;
let fake: FakeEmail;
const ids: Ids = {};
const as = (who: Who): Browser =>
  ({
    anonymous: new Browser(),
    athleteA: s.athleteA.browser,
    athleteB: s.athleteB.browser,
    coach: s.head.browser,
    otherCoach: other.head.browser,
    admin,
  })[who];

async function newSession(): Promise<string> {
  const r = await s.head.browser.call(
    modules["/app/api/athletes/[id]/sessions/route.ts"]!,
    "POST",
    "/api/athletes/x/sessions",
    { params: { id: s.athleteA.id }, body: session },
  );
  return r.json.id;
}
async function newManaged(): Promise<string> {
  const r = await s.head.browser.call(
    modules["/app/api/squads/[id]/athletes/route.ts"]!,
    "POST",
    "/api/squads/x/athletes",
    { params: { id: s.squadId }, body: { name: "Matrix Managed", sports: ["running"] } },
  );
  return r.json.id;
}
async function newLog(): Promise<string> {
  const id = await newSession();
  const r = await s.athleteA.browser.call(
    modules["/app/api/sessions/[id]/log/route.ts"]!,
    "POST",
    "/api/sessions/x/log",
    { params: { id }, body: { status: "done", durationMin: 40, rpe: 4 } },
  );
  return r.json.log?.id ?? r.json.id;
}
async function newTemplate(): Promise<string> {
  const r = await s.head.browser.call(modules["/app/api/templates/route.ts"]!, "POST", "/api/templates", {
    body: { squadId: s.squadId, name: "Matrix template", sport: "running", structure: [step("work", 30, 1)] },
  });
  return r.json.id;
}

let uploads = 0;
const MATRIX: Record<string, Cell> = {
  "GET /api/athletes": { ok: SIGNED_IN, path: () => "/api/athletes", params: () => ({}) },
  "POST /api/athletes/[id]/activities": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/activities",
    params: (i) => ({ id: i.athleteA! }),
    form: () => {
      const f = new FormData();
      // A different file each call (the same file twice is refused as a duplicate).
      const fit = encodeFit({
        start: new Date(Date.UTC(2027, 2, 3, 7, uploads++)),
        sport: "running",
        seconds: Array.from({ length: 600 }, (_, k) => ({ hrBpm: 130 + (k % 10), speedKmh: 10 })),
      });
      f.set("file", new File([new Uint8Array(fit)], "run.fit"));
      return f;
    },
  },
  "GET /api/athletes/[id]/export/[file]": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/export/plan.csv",
    params: (i) => ({ id: i.athleteA!, file: "plan.csv" }),
  },
  "POST /api/athletes/[id]/hand-over": {
    ok: ["coach"],
    path: () => "/api/athletes/x/hand-over",
    params: (i) => ({ id: i.managed! }),
    body: () => ({ email: `handed-${Math.random().toString(36).slice(2)}@matrix.test` }),
    fresh: async () => ({ managed: await newManaged() }),
  },
  "GET /api/athletes/[id]/load": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/load",
    params: (i) => ({ id: i.athleteA! }),
    query: () => "?from=2027-01-01&to=2027-01-31",
  },
  "GET /api/athletes/[id]/logs": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/logs",
    params: (i) => ({ id: i.athleteA! }),
    query: () => "?from=2027-01-01&to=2027-12-31",
  },
  "POST /api/athletes/[id]/logs": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/logs",
    params: (i) => ({ id: i.athleteA! }),
    body: () => ({
      status: "done",
      date: "2027-02-02",
      sport: "running",
      title: "Unplanned jog",
      durationMin: 30,
      rpe: 3,
    }),
  },
  "GET /api/athletes/[id]/profile": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/profile",
    params: (i) => ({ id: i.athleteA! }),
  },
  "PATCH /api/athletes/[id]/profile": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/profile",
    params: (i) => ({ id: i.athleteA! }),
    body: () => ({ restingHrBpm: 50 }),
  },
  "GET /api/athletes/[id]/screening": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/screening",
    params: (i) => ({ id: i.athleteA! }),
  },
  "PUT /api/athletes/[id]/screening": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/screening",
    params: (i) => ({ id: i.athleteA! }),
    body: () => ({ answers: Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, false])) }),
  },
  "POST /api/athletes/[id]/screening/clearance": {
    ok: ["coach"],
    path: () => "/api/athletes/x/screening/clearance",
    params: (i) => ({ id: i.athleteA! }),
    body: () => ({ clearedBy: "Dr Matrix", role: "sports physician", clearedOn: "2026-11-30" }),
  },
  "GET /api/athletes/[id]/seasons": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/seasons",
    params: (i) => ({ id: i.athleteA! }),
  },
  "POST /api/athletes/[id]/seasons": {
    ok: ["coach"],
    path: () => "/api/athletes/x/seasons",
    params: (i) => ({ id: i.athleteA! }),
    body: () => ({
      name: "Matrix season",
      sport: "running",
      startDate: "2027-05-03",
      events: [{ date: "2027-08-01", name: "Race" }],
      weeklyHours: 5,
    }),
  },
  "GET /api/athletes/[id]/sessions": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/sessions",
    params: (i) => ({ id: i.athleteA! }),
    query: () => "?from=2027-04-01&to=2027-04-30",
  },
  "POST /api/athletes/[id]/sessions": {
    ok: ["coach"],
    path: () => "/api/athletes/x/sessions",
    params: (i) => ({ id: i.athleteA! }),
    body: () => session,
  },
  "GET /api/athletes/[id]/tests": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/tests",
    params: (i) => ({ id: i.athleteA! }),
  },
  "POST /api/athletes/[id]/tests": {
    ok: ["coach"],
    path: () => "/api/athletes/x/tests",
    params: (i) => ({ id: i.athleteA! }),
    form: gasForm,
  },
  "GET /api/athletes/[id]/weeks": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/weeks",
    params: (i) => ({ id: i.athleteA! }),
    query: () => "?from=2027-04-05&to=2027-04-11",
  },
  "GET /api/athletes/[id]/zones": {
    ok: A_AND_COACH,
    path: () => "/api/athletes/x/zones",
    params: (i) => ({ id: i.athleteA! }),
  },
  "GET /api/calendar/[feed]": {
    ok: EVERYONE,
    path: (i) => `/api/calendar/${i.feed}`,
    params: (i) => ({ feed: i.feed! }),
  },
  "POST /api/invitations/[token]/accept": {
    ok: [],
    path: () => "/api/invitations/x/accept",
    params: (i) => ({ token: i.invitation! }),
  },
  "PATCH /api/logs/[id]": {
    ok: A_AND_COACH,
    path: () => "/api/logs/x",
    params: (i) => ({ id: i.log! }),
    body: () => ({ rpe: 5 }),
  },
  "GET /api/logs/[id]/messages": {
    ok: A_AND_COACH,
    path: () => "/api/logs/x/messages",
    params: (i) => ({ id: i.log! }),
  },
  "POST /api/logs/[id]/messages": {
    ok: A_AND_COACH,
    path: () => "/api/logs/x/messages",
    params: (i) => ({ id: i.log! }),
    body: () => ({ body: "How did it feel?" }),
  },
  "DELETE /api/logs/[id]": {
    ok: A_AND_COACH,
    path: () => "/api/logs/x",
    params: (i) => ({ id: i.log! }),
    fresh: async () => ({ log: await newLog() }),
  },
  "POST /api/me/calendar-feed": { ok: SIGNED_IN, path: () => "/api/me/calendar-feed", params: () => ({}) },
  "DELETE /api/me/calendar-feed": { ok: SIGNED_IN, path: () => "/api/me/calendar-feed", params: () => ({}) },
  "GET /api/me/notifications": { ok: SIGNED_IN, path: () => "/api/me/notifications", params: () => ({}) },
  "PATCH /api/me/notifications": {
    ok: SIGNED_IN,
    path: () => "/api/me/notifications",
    params: () => ({}),
    body: () => ({ coachDigest: true }),
  },
  "GET /api/me": { ok: SIGNED_IN, path: () => "/api/me", params: () => ({}) },
  "GET /api/me/display": { ok: SIGNED_IN, path: () => "/api/me/display", params: () => ({}) },
  "PATCH /api/me/display": {
    ok: SIGNED_IN,
    path: () => "/api/me/display",
    params: () => ({}),
    body: () => ({ units: "metric" }),
  },
  "GET /api/roster": {
    ok: ["coach"],
    path: () => "/api/roster",
    params: () => ({}),
    query: (i) => `?squad=${i.squad}`,
  },
  "PATCH /api/seasons/[id]/weeks/[weekStart]": {
    ok: ["coach"],
    path: () => "/api/seasons/x/weeks/x",
    params: (i) => ({ id: i.season!, weekStart: i.seasonWeek! }),
    body: () => ({ volumeHours: 4 }),
  },
  "POST /api/sessions/[id]/log": {
    ok: A_AND_COACH,
    path: () => "/api/sessions/x/log",
    params: (i) => ({ id: i.session! }),
    body: () => ({ status: "skipped", skipReason: "ill" }),
    fresh: async () => ({ session: await newSession() }),
  },
  "PATCH /api/sessions/[id]": {
    ok: ["coach"],
    path: () => "/api/sessions/x",
    params: (i) => ({ id: i.session! }),
    body: () => ({ title: "Renamed" }),
  },
  "POST /api/sessions/[id]": {
    ok: ["coach"],
    path: () => "/api/sessions/x",
    params: (i) => ({ id: i.session! }),
    body: () => ({ date: "2027-04-20" }),
  },
  "GET /api/sessions/[id]/messages": {
    ok: A_AND_COACH,
    path: () => "/api/sessions/x/messages",
    params: (i) => ({ id: i.session! }),
  },
  "POST /api/sessions/[id]/messages": {
    ok: A_AND_COACH,
    path: () => "/api/sessions/x/messages",
    params: (i) => ({ id: i.session! }),
    body: () => ({ body: "Keep it easy." }),
  },
  "GET /api/sessions/[id]/workout": {
    ok: A_AND_COACH,
    path: () => "/api/sessions/x/workout",
    params: (i) => ({ id: i.session! }),
  },
  "DELETE /api/sessions/[id]": {
    ok: ["coach"],
    path: () => "/api/sessions/x",
    params: (i) => ({ id: i.session! }),
    fresh: async () => ({ session: await newSession() }),
  },
  "POST /api/squads/[id]/athletes": {
    ok: ["coach"],
    path: () => "/api/squads/x/athletes",
    params: (i) => ({ id: i.squad! }),
    body: () => ({ name: "Added Athlete", sports: ["cycling"] }),
  },
  "GET /api/squads/[id]/invitations": {
    ok: ["coach"],
    path: () => "/api/squads/x/invitations",
    params: (i) => ({ id: i.squad! }),
  },
  "POST /api/squads/[id]/invitations": {
    ok: ["coach"],
    path: () => "/api/squads/x/invitations",
    params: (i) => ({ id: i.squad! }),
    body: () => ({ email: `new-${Math.random().toString(36).slice(2)}@matrix.test`, role: "athlete" }),
  },
  "DELETE /api/squads/[id]/invitations/[invitationId]": {
    ok: ["coach"],
    path: () => "/api/squads/x/invitations/x",
    params: (i) => ({ id: i.squad!, invitationId: i.openInvitation! }),
    fresh: async (i) => {
      const r = await as("coach").call(
        modules["/app/api/squads/[id]/invitations/route.ts"]!,
        "POST",
        "/api/squads/x/invitations",
        {
          params: { id: i.squad! },
          body: { email: `withdrawn-${Math.random().toString(36).slice(2)}@matrix.test`, role: "athlete" },
        },
      );
      return { openInvitation: r.json.id as string };
    },
  },
  "DELETE /api/squads/[id]/members/[userId]": {
    ok: ["coach"],
    path: () => "/api/squads/x/members/x",
    params: (i) => ({ id: i.squad!, userId: i.member! }),
    fresh: async () => {
      const b = new Browser("198.51.100.77");
      const u = await b.signUp("Matrix member", `member-${Math.random().toString(36).slice(2)}@matrix.test`);
      await query(`insert into membership (squad_id, user_id, role) values ($1, $2, 'athlete')`, [s.squadId, u.id]);
      return { member: u.id };
    },
  },
  "POST /api/zone-sets/[id]/choose": {
    ok: ["coach"],
    path: () => "/api/zone-sets/x/choose",
    params: (i) => ({ id: i.zoneSet! }),
  },
  "POST /api/squads/[id]/plan": {
    ok: ["coach"],
    path: () => "/api/squads/x/plan",
    params: (i) => ({ id: i.squad! }),
    body: (i) => ({
      mode: "template",
      templateId: i.template,
      date: "2027-04-07",
      athleteIds: [i.athleteA],
      preview: true,
    }),
  },
  "POST /api/athletes/[id]/weeks/[weekStart]/copy": {
    ok: ["coach"],
    path: () => "/api/athletes/x/weeks/2027-04-05/copy",
    params: (i) => ({ id: i.athleteA!, weekStart: "2027-04-05" }),
    body: () => ({ targetWeeks: ["2027-04-12"], preview: true }),
  },
  "GET /api/squads/[id]/week": {
    ok: ["coach"],
    path: () => "/api/squads/x/week",
    params: (i) => ({ id: i.squad! }),
    query: () => "?week=2027-04-05",
  },
  "GET /api/squads": { ok: SIGNED_IN, path: () => "/api/squads", params: () => ({}) },
  "POST /api/squads": {
    ok: SIGNED_IN,
    path: () => "/api/squads",
    params: () => ({}),
    body: () => ({ name: "Matrix squad" }),
  },
  "GET /api/templates/[id]": { ok: ["coach"], path: () => "/api/templates/x", params: (i) => ({ id: i.template! }) },
  "PATCH /api/templates/[id]": {
    ok: ["coach"],
    path: () => "/api/templates/x",
    params: (i) => ({ id: i.template! }),
    body: () => ({ name: "Matrix template 2" }),
  },
  "DELETE /api/templates/[id]": {
    ok: ["coach"],
    path: () => "/api/templates/x",
    params: (i) => ({ id: i.template! }),
    fresh: async () => ({ template: await newTemplate() }),
  },
  "GET /api/templates": { ok: SIGNED_IN, path: () => "/api/templates", params: () => ({}) },
  "POST /api/templates": {
    ok: ["coach"],
    path: () => "/api/templates",
    params: () => ({}),
    body: (i) => ({ squadId: i.squad, name: "Matrix template", sport: "running", structure: [step("work", 30, 1)] }),
  },
  "GET /api/tests/[id]/file": { ok: A_AND_COACH, path: () => "/api/tests/x/file", params: (i) => ({ id: i.test! }) },
  "GET /api/tests/[id]": { ok: A_AND_COACH, path: () => "/api/tests/x", params: (i) => ({ id: i.test! }) },
  "PUT /api/tests/[id]/segment": {
    ok: ["coach"],
    path: () => "/api/tests/x/segment",
    params: (i) => ({ id: i.test! }),
    body: () => ({ fromS: null, toS: null }),
  },
  "PATCH /api/tests/[id]/thresholds": {
    ok: ["coach"],
    path: () => "/api/tests/x/thresholds",
    params: (i) => ({ id: i.test! }),
    body: () => ({ vt1: { hrBpm: 140 }, vt2: { hrBpm: 165 } }),
  },
  // The soak's floor writes only with TIDEMARK_SOAK_FLOOR=1 (never set here): refused to everyone.
  "POST /api/soak-floor": {
    ok: [],
    path: () => "/api/soak-floor",
    params: () => ({}),
  },
  "POST /api/unsubscribe/[token]": {
    ok: EVERYONE,
    path: () => "/api/unsubscribe/x",
    params: (i) => ({ token: i.unsubscribe! }),
  },
};

beforeAll(async () => {
  await resetDatabase();
  fake = await startFakeEmail({ quiet: true });
  process.env.RESEND_BASE_URL = fake.url;
  resetConfig();
  s = await makeSquad("mx");
  other = await makeSquad("my");
  admin = new Browser("198.51.100.9");
  const adminUser = await admin.signUp("Site admin", `admin-${Date.now()}@matrix.test`);
  await query(`update "user" set is_admin = true where id = $1`, [adminUser.id]);
  Object.assign(ids, { athleteA: s.athleteA.id, squad: s.squadId });
  ids.session = await newSession();
  ids.log = await newLog();
  ids.managed = await newManaged();
  ids.template = await newTemplate();
  const season = await s.head.browser.call(
    modules["/app/api/athletes/[id]/seasons/route.ts"]!,
    "POST",
    "/api/athletes/x/seasons",
    {
      params: { id: s.athleteA.id },
      body: {
        name: "Season",
        sport: "running",
        startDate: "2027-01-04",
        events: [{ date: "2027-06-06", name: "Race" }],
        weeklyHours: 6,
      },
    },
  );
  ids.season = season.json.id;
  ids.seasonWeek = season.json.weeks[2].weekStart;
  const test = await s.head.browser.call(
    modules["/app/api/athletes/[id]/tests/route.ts"]!,
    "POST",
    "/api/athletes/x/tests",
    { params: { id: s.athleteA.id }, form: gasForm() },
  );
  ids.test = test.json.id ?? test.json.test?.id;
  ids.zoneSet =
    ((await query(`select id from zone_set where athlete_id = $1 limit 1`, [s.athleteA.id])) as { id: string }[])[0]
      ?.id ?? "";
  const feed = await s.athleteA.browser.call(
    modules["/app/api/me/calendar-feed/route.ts"]!,
    "POST",
    "/api/me/calendar-feed",
  );
  ids.feed = (feed.json.url as string).split("/api/calendar/")[1]!;
  await s.head.browser.call(
    modules["/app/api/squads/[id]/invitations/route.ts"]!,
    "POST",
    "/api/squads/x/invitations",
    { params: { id: s.squadId }, body: { email: "invitee@matrix.test", role: "athlete" } },
  );
  const [inv] = await query<{ meta: { url: string } }>(
    `select meta from outbox where kind = 'invitation' and to_address = 'invitee@matrix.test'`,
  );
  ids.invitation = inv!.meta.url.split("/invite/")[1]!;
  ids.unsubscribe = unsubscribeToken(process.env.BETTER_AUTH_SECRET ?? "", s.athleteA.id, "coach_digest");
  for (const k of ["session", "log", "template", "season", "test", "zoneSet"]) expect(ids[k], k).toBeTruthy();
});

afterAll(async () => {
  await fake?.stop();
});

describe("authorization matrix", () => {
  it("every route handler has an entry, and every entry a route", () => {
    const found = Object.entries(modules).flatMap(([file, mod]) => {
      const route = file.replace(/^\/app/, "").replace(/\/route\.ts$/, "");
      if (route.startsWith("/api/auth/")) return []; // better-auth's own endpoints: sign-in, sign-up, sessions
      return ["GET", "POST", "PUT", "PATCH", "DELETE"]
        .filter((m) => typeof mod[m] === "function")
        .map((m) => `${m} ${route}`);
    });
    expect(found.sort()).toEqual(Object.keys(MATRIX).sort());
  });

  for (const [key, cell] of Object.entries(MATRIX)) {
    it(key, async () => {
      const [method, route] = key.split(" ") as [string, string];
      const mod = modules[`/app${route}/route.ts`]!;
      const results: string[] = [];
      // Refusals first (they must change nothing), then the successful calls, each on a fresh resource where one is used up.
      const order = [...WHO.filter((w) => !cell.ok.includes(w)), ...WHO.filter((w) => cell.ok.includes(w))];
      for (const who of order) {
        const local = cell.fresh && cell.ok.includes(who) ? { ...ids, ...(await cell.fresh(ids)) } : ids;
        const r = await as(who).call(mod, method as never, cell.path(local), {
          params: cell.params(local),
          query: cell.query?.(local),
          body: cell.body?.(local),
          form: cell.form?.(local),
        });
        const allowed = cell.ok.includes(who);
        const expected = allowed ? "2xx" : who === "anonymous" ? "401" : "403 or 404";
        const good = allowed
          ? r.status >= 200 && r.status < 300
          : who === "anonymous"
            ? r.status === 401
            : r.status === 403 || r.status === 404;
        if (!good)
          results.push(`${who}: expected ${expected}, got ${r.status} ${JSON.stringify(r.json ?? null).slice(0, 160)}`);
        if (!allowed && r.json && typeof r.json === "object")
          expect(
            Object.keys(r.json).filter((k) => !["error", "fieldErrors"].includes(k)),
            `${who} sees no data`,
          ).toEqual([]);
      }
      expect(results).toEqual([]);
    });
  }
});
