// Attacks that must fail, through the real route handlers on real PostgreSQL: each checks the answer and that nothing was
// written. (The outbox page and the sign-in redirect are in test/browser/security.test.ts.)
import { describe, expect, it } from "vitest";
import ExcelJS from "exceljs";
import { resetConfig } from "@/features/platform/server/config";
import * as logRoute from "@/app/api/logs/[id]/route";
import * as meRoute from "@/app/api/me/route";
import * as acceptRoute from "@/app/api/invitations/[token]/accept/route";
import * as invitationsRoute from "@/app/api/squads/[id]/invitations/route";
import * as invitationRoute from "@/app/api/squads/[id]/invitations/[invitationId]/route";
import * as squadsRoute from "@/app/api/squads/route";
import * as templatesRoute from "@/app/api/templates/route";
import * as unsubscribeRoute from "@/app/api/unsubscribe/[token]/route";
import { createAuth } from "@/features/auth/server/auth";
import { forgetUserSessions } from "@/features/auth/server/session-memo";
import { SIGN_IN_FAILURES_BEFORE_PAUSE } from "@/features/auth/server/sign-in-guard";
import * as sessionsRoute from "@/app/api/athletes/[id]/sessions/route";
import * as sessionRoute from "@/app/api/sessions/[id]/route";
import * as exportRoute from "@/app/api/athletes/[id]/export/[file]/route";
import * as templateRoute from "@/app/api/templates/[id]/route";
import * as seasonsRoute from "@/app/api/athletes/[id]/seasons/route";
import * as seasonWeekRoute from "@/app/api/seasons/[id]/weeks/[weekStart]/route";
import * as profileRoute from "@/app/api/athletes/[id]/profile/route";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import * as weeksRoute from "@/app/api/athletes/[id]/weeks/route";
import * as squadWeekRoute from "@/app/api/squads/[id]/week/route";
import { Browser, ORIGIN } from "../support/api";
import { makeSquad } from "../support/squad";
import { query } from "../support/db";

const unique = (label: string) =>
  `${label}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@security.test`;
const count = async (sql: string, params: (string | number)[] = []) =>
  Number((await query<{ n: string }>(sql, params))[0]!.n);

describe("e-mail verification", () => {
  it("an account whose address is not confirmed cannot sign in, and a fresh link is sent", async () => {
    const email = unique("unconfirmed");
    const b = new Browser("198.51.100.201");
    await b.signUp("Not Yet", email, "correct-horse-battery", { verify: false });
    expect((await b.call(meRoute, "GET", "/api/me")).status).toBe(401);
    const before = await count(
      `select count(*) as n from outbox where kind = 'email_verification' and to_address = $1`,
      [email],
    );
    const r = await b.signIn(email);
    expect(r.status).toBe(403);
    expect(r.json.code).toBe("EMAIL_NOT_VERIFIED");
    expect(b.cookie).not.toMatch(/session_token=/);
    expect(
      await count(`select count(*) as n from outbox where kind = 'email_verification' and to_address = $1`, [email]),
    ).toBe(before + 1);
    // Nor can it act: creating a squad needs a session.
    expect((await b.call(squadsRoute, "POST", "/api/squads", { body: { name: "Squat squad" } })).status).toBe(401);
    expect(await count(`select count(*) as n from squad where name = 'Squat squad'`)).toBe(0);
    // The link confirms the address and signs in.
    await b.verifyEmail(email);
    expect((await b.call(meRoute, "GET", "/api/me")).status).toBe(200);
  });

  it("a session of an account that is not (or no longer) confirmed counts as none", async () => {
    const email = unique("demoted");
    const b = new Browser("198.51.100.202");
    await b.signUp("Was Confirmed", email);
    expect((await b.call(meRoute, "GET", "/api/me")).status).toBe(200);
    const [row] = await query<{ id: string }>(
      `update "user" set email_verified = false where email = $1 returning id`,
      [email],
    );
    // As after a restart: the process's memory of verified sessions starts empty.
    forgetUserSessions(row!.id);
    expect((await b.call(meRoute, "GET", "/api/me")).status).toBe(401);
  });

  it("sign-up with an address that has an account answers as for a new one, creates nothing and tells the owner", async () => {
    const email = unique("owner");
    await new Browser("198.51.100.204").signUp("Real Owner", email);
    const users = await count(`select count(*) as n from "user" where lower(email) = lower($1)`, [email]);
    const fresh = await new Browser("198.51.100.205").auth("POST", "/sign-up/email", {
      name: "Imposter",
      email: unique("fresh"),
      password: "long-enough-password",
    });
    const taken = await new Browser("198.51.100.205").auth("POST", "/sign-up/email", {
      name: "Imposter",
      email,
      password: "long-enough-password",
    });
    expect(taken.status).toBe(fresh.status);
    expect(Object.keys(taken.json).sort()).toEqual(Object.keys(fresh.json).sort());
    expect(await count(`select count(*) as n from "user" where lower(email) = lower($1)`, [email])).toBe(users);
    expect(
      await count(`select count(*) as n from outbox where kind = 'existing_account' and to_address = $1`, [email]),
    ).toBe(1);
    // The imposter's password does not open the account.
    expect((await new Browser("198.51.100.206").signIn(email, "long-enough-password")).status).toBe(401);
  });
});

describe("rate limits and the per-account pause", () => {
  it("a made-up X-Forwarded-For per request buys no fresh attempts when no trusted proxy is configured", async () => {
    // The app's defaults (no TIDEMARK_CLIENT_IP_HEADER), as on a loopback installation.
    const saved = { header: process.env.TIDEMARK_CLIENT_IP_HEADER, limit: process.env.TIDEMARK_SIGN_IN_LIMIT_PER_MIN };
    delete process.env.TIDEMARK_CLIENT_IP_HEADER;
    process.env.TIDEMARK_SIGN_IN_LIMIT_PER_MIN = "8";
    resetConfig();
    const auth = createAuth();
    if (saved.header === undefined) delete process.env.TIDEMARK_CLIENT_IP_HEADER;
    else process.env.TIDEMARK_CLIENT_IP_HEADER = saved.header;
    if (saved.limit === undefined) delete process.env.TIDEMARK_SIGN_IN_LIMIT_PER_MIN;
    else process.env.TIDEMARK_SIGN_IN_LIMIT_PER_MIN = saved.limit;
    resetConfig();
    await query(`delete from rate_limit`);
    const statuses: number[] = [];
    for (let i = 0; i < 10; i++) {
      const res = await auth.handler(
        new Request(`${ORIGIN}/api/auth/sign-in/email`, {
          method: "POST",
          headers: { "content-type": "application/json", origin: ORIGIN, "x-forwarded-for": `203.0.113.${100 + i}` },
          body: JSON.stringify({ email: unique(`nobody${i}`), password: "wrong-password-123" }),
        }),
      );
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 8).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(8)).toEqual([429, 429]);
    await query(`delete from rate_limit`);
  });

  it("wrong passwords from many addresses pause sign-in to that account, tell its owner, and the pause ends", async () => {
    const email = unique("guessed");
    await new Browser("198.51.100.210").signUp("Guessed At", email);
    for (let i = 0; i < SIGN_IN_FAILURES_BEFORE_PAUSE; i++) {
      expect((await new Browser(`192.0.2.${10 + i}`).signIn(email, `wrong-password-${i}`)).status).toBe(401);
    }
    // Now even the right password waits, from a fresh address, with a clear reason; no session is made.
    const b = new Browser("192.0.2.99");
    const paused = await b.signIn(email);
    expect(paused.status).toBe(429);
    expect(paused.json.code).toBe("SIGN_IN_PAUSED");
    expect(paused.json.message).toMatch(/paused for 15 more minutes/);
    expect(b.cookie).not.toMatch(/session_token=/);
    expect(
      await count(`select count(*) as n from outbox where kind = 'sign_in_paused' and to_address = $1`, [email]),
    ).toBe(1);
    // Other accounts on the same addresses are not affected.
    const other = unique("neighbour");
    await new Browser("198.51.100.211").signUp("Neighbour", other);
    expect((await new Browser("192.0.2.10").signIn(other)).status).toBe(200);
    // When the pause is over, the right password works and the count starts again.
    await query(`update sign_in_guard set locked_until = now() - interval '1 second' where email = lower($1)`, [email]);
    expect((await new Browser("192.0.2.100").signIn(email)).status).toBe(200);
    expect(await count(`select count(*) as n from sign_in_guard where email = lower($1)`, [email])).toBe(0);
  });
});

describe("cross-site requests to the app's own API", () => {
  const signedIn = async () => {
    const b = new Browser("198.51.100.220");
    await b.signUp("Csrf Target", unique("csrf"));
    return b;
  };

  it("a text/plain POST from a foreign origin is refused and writes nothing", async () => {
    const b = await signedIn();
    const name = `Forged ${Date.now()}`;
    const r = await b.call(squadsRoute, "POST", "/api/squads", {
      rawBody: JSON.stringify({ name }),
      headers: { origin: "https://evil.test", "content-type": "text/plain" },
    });
    expect([403, 415]).toContain(r.status);
    expect(await count(`select count(*) as n from squad where name = $1`, [name])).toBe(0);
  });

  it("a text/plain POST from the app's own origin answers 415 (only JSON or multipart bodies)", async () => {
    const b = await signedIn();
    const name = `Plain ${Date.now()}`;
    const r = await b.call(squadsRoute, "POST", "/api/squads", {
      rawBody: JSON.stringify({ name }),
      headers: { "content-type": "text/plain" },
    });
    expect(r.status).toBe(415);
    expect(r.json.error).toMatch(/JSON/);
    expect(await count(`select count(*) as n from squad where name = $1`, [name])).toBe(0);
  });

  it("a JSON POST with a foreign Origin, or a cross-site Sec-Fetch-Site without one, answers 403", async () => {
    const b = await signedIn();
    const name = `Foreign ${Date.now()}`;
    const foreign = await b.call(squadsRoute, "POST", "/api/squads", {
      body: { name },
      headers: { origin: "https://evil.test" },
    });
    expect(foreign.status).toBe(403);
    const fetchSite = await b.call(squadsRoute, "POST", "/api/squads", {
      body: { name },
      headers: { origin: "", "sec-fetch-site": "cross-site" },
    });
    expect(fetchSite.status).toBe(403);
    expect(await count(`select count(*) as n from squad where name = $1`, [name])).toBe(0);
    // The same request from the app's own pages works.
    const own = await b.call(squadsRoute, "POST", "/api/squads", {
      body: { name },
      headers: { "sec-fetch-site": "same-origin" },
    });
    expect(own.status).toBe(201);
  });

  it("a cross-site DELETE and a cross-site POST elsewhere are refused before anything is looked up", async () => {
    const b = await signedIn();
    const id = "00000000-0000-4000-8000-000000000000";
    const del = await b.call(logRoute, "DELETE", `/api/logs/${id}`, {
      params: { id },
      headers: { origin: "https://evil.test" },
    });
    expect(del.status).toBe(403);
    const post = await b.call(templatesRoute, "POST", "/api/templates", {
      body: {},
      headers: { origin: "https://evil.test" },
    });
    expect(post.status).toBe(403);
  });
});

describe("invitations", () => {
  it("a withdrawn invitation cannot be accepted, and only the head coach can withdraw one", async () => {
    const { squadId, head, coach } = await makeSquad("withdraw");
    const email = unique("invitee");
    const sent = await head.browser.call(invitationsRoute, "POST", `/api/squads/${squadId}/invitations`, {
      params: { id: squadId },
      body: { email, role: "athlete" },
    });
    expect(sent.status).toBe(201);
    const path = `/api/squads/${squadId}/invitations/${sent.json.id}`;
    const params = { id: squadId, invitationId: sent.json.id };
    expect((await coach.browser.call(invitationRoute, "DELETE", path, { params })).status).toBe(403);
    expect((await head.browser.call(invitationRoute, "DELETE", path, { params })).status).toBe(204);
    expect((await head.browser.call(invitationRoute, "DELETE", path, { params })).status).toBe(404);
    const [row] = await query<{ meta: { url: string } }>(
      `select meta from outbox where kind = 'invitation' and to_address = $1`,
      [email],
    );
    const token = row!.meta.url.split("/invite/")[1]!;
    const invitee = new Browser("198.51.100.240");
    await invitee.signUp("Late Invitee", email);
    const accept = await invitee.call(acceptRoute, "POST", `/api/invitations/${token}/accept`, { params: { token } });
    expect(accept.status).toBe(410);
    expect(accept.json.error).toMatch(/withdrawn/);
    expect(
      await count(`select count(*) as n from membership m join "user" u on u.id = m.user_id where u.email = $1`, [
        email,
      ]),
    ).toBe(0);
  });
});

describe("two coaches editing the same thing", () => {
  it("a change that names an older version answers 409 with the current state and writes nothing", async () => {
    const { squadId, head, coach, athleteA } = await makeSquad("versions");
    // A session: the head coach moves it; the coach, still looking at version 1, tries to rename it.
    const created = await head.browser.call(sessionsRoute, "POST", `/api/athletes/${athleteA.id}/sessions`, {
      params: { id: athleteA.id },
      body: {
        date: "2027-05-03",
        title: "Steady",
        sport: "running",
        structure: [{ type: "step", kind: "work", durationS: 3600, zone: 1 }],
      },
    });
    const id = created.json.id as string;
    const moved = await head.browser.call(sessionRoute, "PATCH", `/api/sessions/${id}`, {
      params: { id },
      body: { date: "2027-05-04", version: 1 },
    });
    expect(moved.status).toBe(200);
    expect(moved.json.version).toBe(2);
    const stale = await coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${id}`, {
      params: { id },
      body: { title: "Renamed", version: 1 },
    });
    expect(stale.status).toBe(409);
    expect(stale.json.current).toMatchObject({ id, date: "2027-05-04", title: "Steady", version: 2 });
    expect((await query<{ title: string }>(`select title from planned_session where id = $1`, [id]))[0]!.title).toBe(
      "Steady",
    );
    expect(
      (
        await coach.browser.call(sessionRoute, "PATCH", `/api/sessions/${id}`, {
          params: { id },
          body: { title: "Renamed", version: 2 },
        })
      ).status,
    ).toBe(200);

    // A template.
    const t = await head.browser.call(templatesRoute, "POST", "/api/templates", {
      body: {
        squadId,
        name: "Easy hour",
        sport: "running",
        structure: [{ type: "step", kind: "work", durationS: 3600, zone: 1 }],
      },
    });
    const tid = t.json.id as string;
    expect(
      (
        await head.browser.call(templateRoute, "PATCH", `/api/templates/${tid}`, {
          params: { id: tid },
          body: { name: "Easy hour (long)", version: 1 },
        })
      ).status,
    ).toBe(200);
    const staleTemplate = await coach.browser.call(templateRoute, "PATCH", `/api/templates/${tid}`, {
      params: { id: tid },
      body: { name: "Recovery hour", version: 1 },
    });
    expect(staleTemplate.status).toBe(409);
    expect(staleTemplate.json.current).toMatchObject({ name: "Easy hour (long)", version: 2 });

    // A season week.
    const season = await head.browser.call(seasonsRoute, "POST", `/api/athletes/${athleteA.id}/seasons`, {
      params: { id: athleteA.id },
      body: {
        name: "Summer",
        sport: "running",
        startDate: "2027-01-04",
        events: [{ date: "2027-06-06", name: "Summer 10k" }],
        weeklyHours: 6,
      },
    });
    const seasonId = season.json.id as string;
    const weekStart = season.json.weeks[2].weekStart as string;
    const weekCall = (who: Browser, body: unknown) =>
      who.call(seasonWeekRoute, "PATCH", `/api/seasons/${seasonId}/weeks/${weekStart}`, {
        params: { id: seasonId, weekStart },
        body,
      });
    expect((await weekCall(head.browser, { volumeHours: 5, version: 1 })).status).toBe(200);
    const staleWeek = await weekCall(coach.browser, { volumeHours: 9, version: 1 });
    expect(staleWeek.status).toBe(409);
    expect(staleWeek.json.current.version).toBe(2);
    const [stored] = await query<{ weeks: { weekStart: string; volumeHours: number }[] }>(
      `select weeks from season where id = $1`,
      [seasonId],
    );
    expect(stored!.weeks.find((w) => w.weekStart === weekStart)!.volumeHours).toBe(5);

    // A profile: the athlete and the coach at once.
    const profile = (who: Browser, body: unknown) =>
      who.call(profileRoute, "PATCH", `/api/athletes/${athleteA.id}/profile`, { params: { id: athleteA.id }, body });
    const read = await head.browser.call(profileRoute, "GET", `/api/athletes/${athleteA.id}/profile`, {
      params: { id: athleteA.id },
    });
    const v = read.json.profile.version as number;
    expect((await profile(athleteA.browser, { bodyMassKg: 61, version: v })).status).toBe(200);
    const staleProfile = await profile(head.browser, { bodyMassKg: 70, version: v });
    expect(staleProfile.status).toBe(409);
    expect(staleProfile.json.current).toMatchObject({ bodyMassKg: 61, version: v + 1 });
    // Without a version the change is taken as it comes (older clients).
    expect((await profile(head.browser, { restingHrBpm: 50 })).status).toBe(200);
  });
});

describe("CSV and workbook downloads", () => {
  it("the athlete and their coaches download the plan, logs and zone history (CSV and .xlsx); formula cells are neutralised; others get 404", async () => {
    const { head, athleteA } = await makeSquad("export");
    const other = await makeSquad("export-other");
    const made = await head.browser.call(sessionsRoute, "POST", `/api/athletes/${athleteA.id}/sessions`, {
      params: { id: athleteA.id },
      body: {
        date: "2027-03-02",
        title: '=HYPERLINK("http://evil.test","x")',
        sport: "running",
        structure: [{ type: "step", kind: "work", durationS: 2700, zone: 1 }],
      },
    });
    expect(made.status).toBe(201);
    const get = (who: Browser, file: string, query = "?from=2027-03-01&to=2027-03-31") =>
      who.call(exportRoute, "GET", `/api/athletes/${athleteA.id}/export/${file}`, {
        params: { id: athleteA.id, file },
        query,
      });
    for (const who of [athleteA.browser, head.browser]) {
      const r = await get(who, "plan.csv");
      expect(r.status).toBe(200);
      expect(r.headers.get("content-type")).toMatch(/text\/csv/);
      expect(r.headers.get("content-disposition")).toMatch(
        /attachment; filename="tidemark-plan-2027-03-01-to-2027-03-31.csv"/,
      );
      const text = String(r.json).replace(/^\uFEFF/, "");
      expect(text.split("\r\n")[0]).toBe(
        "date,title,sport,kind,planned_min,zone1_min,zone2_min,zone3_min,notes,logged,done_min,rpe",
      );
      expect(text).toContain(`2027-03-02,"'=HYPERLINK(""http://evil.test"",""x"")",running,training,45,45,0,0`);
    }
    expect((await get(head.browser, "logs.csv")).status).toBe(200);
    expect((await get(head.browser, "zones.csv", "")).status).toBe(200);
    // The same plan as a workbook, read back with exceljs: the same columns, the formula-like title kept as text.
    for (const who of [athleteA.browser, head.browser]) {
      const x = await get(who, "plan.xlsx");
      expect(x.status).toBe(200);
      expect(x.headers.get("content-type")).toBe("application/vnd.openxmlformats-officedocument.spreadsheetml.sheet");
      expect(x.headers.get("content-disposition")).toMatch(/filename="tidemark-plan-2027-03-01-to-2027-03-31.xlsx"/);
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load(Buffer.from(x.bytes) as unknown as ArrayBuffer);
      const ws = wb.worksheets[0]!;
      expect((ws.getRow(1).values as unknown[]).slice(1, 5)).toEqual(["date", "title", "sport", "kind"]);
      expect(ws.getRow(2).getCell(2).type).toBe(ExcelJS.ValueType.String);
      expect(ws.getRow(2).getCell(2).value).toBe('=HYPERLINK("http://evil.test","x")');
      expect(ws.getRow(2).getCell(5).value).toBe(45);
    }
    expect((await get(head.browser, "logs.xlsx")).status).toBe(200);
    expect((await get(head.browser, "zones.xlsx", "")).status).toBe(200);
    expect((await get(other.head.browser, "plan.xlsx")).status).toBe(404);
    expect((await get(other.head.browser, "plan.csv")).status).toBe(404);
    expect((await get(head.browser, "secrets.csv")).status).toBe(404);
    expect((await get(head.browser, "plan.csv", "?from=2020-01-01&to=2027-01-01")).status).toBe(400);
  });
});

describe("edge inputs", () => {
  it("years 0000 and 9999, impossible dates and absurd sessions answer 400 with a reason and write nothing", async () => {
    const { squadId, head, athleteA } = await makeSquad("edge");
    const weeks = await head.browser.call(weeksRoute, "GET", `/api/athletes/${athleteA.id}/weeks`, {
      params: { id: athleteA.id },
      query: "?from=0000-01-01&to=0000-02-01",
    });
    expect(weeks.status).toBe(400);
    const far = await head.browser.call(weeksRoute, "GET", `/api/athletes/${athleteA.id}/weeks`, {
      params: { id: athleteA.id },
      query: "?from=9999-12-01&to=9999-12-31",
    });
    expect(far.status).toBe(400);
    const squadWeek = await head.browser.call(squadWeekRoute, "GET", `/api/squads/${squadId}/week`, {
      params: { id: squadId },
      query: "?week=9999-12-27",
    });
    expect(squadWeek.status).toBe(400);
    expect(squadWeek.json.fieldErrors.week[0]).toMatch(/between 1900 and 2200/);

    const session = (date: string, durationS = 3600, times = 2) => ({
      date,
      title: "Long one",
      sport: "running",
      structure: [{ type: "repeat", times, steps: [{ type: "step", kind: "work", durationS, zone: 1 }] }],
    });
    const sessionsCall = (body: unknown) =>
      head.browser.call(sessionsRoute, "POST", `/api/athletes/${athleteA.id}/sessions`, {
        params: { id: athleteA.id },
        body,
      });
    expect((await sessionsCall(session("9999-01-04"))).status).toBe(400);
    const huge = await sessionsCall(session("2027-01-04", 12 * 3600, 50));
    expect(huge.status).toBe(400);
    expect(JSON.stringify(huge.json)).toMatch(/at most 12 hours/);
    expect(await count(`select count(*) as n from planned_session where athlete_id = $1`, [athleteA.id])).toBe(0);

    const test = await head.browser.call(testsRoute, "POST", `/api/athletes/${athleteA.id}/tests`, {
      params: { id: athleteA.id },
      body: {
        kind: "manual",
        meta: { sport: "running", protocol: "field estimate", date: "2026-02-30", endedBy: "plan" },
        vt1: { hrBpm: 140 },
        vt2: { hrBpm: 165 },
      },
    });
    expect(test.status).toBe(400);
    expect(JSON.stringify(test.json)).toMatch(/real calendar date/);
    expect(await count(`select count(*) as n from athlete_test where athlete_id = $1`, [athleteA.id])).toBe(0);
  });

  it("names and titles with line breaks or control characters are refused, sign-up included", async () => {
    const b = new Browser("198.51.100.230");
    const r = await b.auth("POST", "/sign-up/email", {
      name: "Eve\r\nBcc: all@example.test",
      email: unique("crlf"),
      password: "long-enough-password",
    });
    expect(r.status).toBe(400);
    expect(r.json.message).toMatch(/one line/);
    await b.signUp("Plain Name", unique("plain"));
    const squad = await b.call(squadsRoute, "POST", "/api/squads", { body: { name: "Harbour\nSubject: hi" } });
    expect(squad.status).toBe(400);
    expect(squad.json.fieldErrors.name[0]).toMatch(/one line/);
    const rename = await b.auth("POST", "/update-user", { name: "Tab\tName" });
    expect(rename.status).toBe(400);
  });

  it("an unsubscribe token with broken percent-encoding answers 404, not 500", async () => {
    const r = await new Browser().call(unsubscribeRoute, "POST", "/api/unsubscribe/%E0%A4%A", {
      params: { token: "%E0%A4%A" },
    });
    expect(r.status).toBe(404);
  });
});
