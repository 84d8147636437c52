// Sign-up, sign-in, squads, invitations and roster visibility through the real route handlers on real PostgreSQL.
import { beforeAll, describe, expect, it } from "vitest";
import * as meRoute from "@/app/api/me/route";
import * as authRoute from "@/app/api/auth/[...all]/route";
import * as displayRoute from "@/app/api/me/display/route";
import * as logsRoute from "@/app/api/athletes/[id]/logs/route";
import * as exportRoute from "@/app/api/athletes/[id]/export/[file]/route";
import * as athletesRoute from "@/app/api/athletes/route";
import * as profileRoute from "@/app/api/athletes/[id]/profile/route";
import * as squadsRoute from "@/app/api/squads/route";
import * as invitationsRoute from "@/app/api/squads/[id]/invitations/route";
import * as acceptRoute from "@/app/api/invitations/[token]/accept/route";
import { Browser } from "../support/api";
import { query, resetDatabase } from "../support/db";

async function latestInvitationToken(to: string): Promise<string> {
  const rows = await query<{ meta: { url: string } }>(
    `select meta from outbox where kind = 'invitation' and to_address = $1 order by created_at desc limit 1`,
    [to],
  );
  const url = rows[0]?.meta.url;
  if (!url) throw new Error(`no invitation for ${to}`);
  return url.split("/invite/")[1]!;
}

async function invite(head: Browser, squadId: string, email: string, role: "athlete" | "coach") {
  const r = await head.call(invitationsRoute, "POST", `/api/squads/${squadId}/invitations`, {
    params: { id: squadId },
    body: { email, role },
  });
  expect(r.status).toBe(201);
  return latestInvitationToken(email);
}

async function joinAs(name: string, email: string, token: string) {
  const b = new Browser();
  await b.signUp(name, email);
  const r = await b.call(acceptRoute, "POST", `/api/invitations/${token}/accept`, { params: { token } });
  return { browser: b, response: r };
}

describe("accounts, squads and invitations", () => {
  const head = new Browser();
  const otherHead = new Browser();
  let squadId = "";
  let otherSquadId = "";
  let athleteA: Browser, athleteB: Browser, coach: Browser;
  let athleteAId = "",
    athleteBId = "";

  beforeAll(async () => {
    await resetDatabase();
    await head.signUp("Hana Head", "hana@example.test");
    const s = await head.call(squadsRoute, "POST", "/api/squads", { body: { name: "Harbour Squad" } });
    expect(s.status).toBe(201);
    squadId = s.json.id;
    // A new squad starts with the starter templates (planning/lib/starter-templates.ts): every sport has some.
    const starters = await query<{ sport: string; n: number }>(
      `select sport, count(*)::int as n from session_template where squad_id = $1 group by sport`,
      [squadId],
    );
    expect(starters.map((r) => r.sport).sort()).toEqual([
      "cross_country_skiing",
      "cycling",
      "rowing",
      "running",
      "swimming",
      "triathlon",
      "walking",
    ]);

    await otherHead.signUp("Olaf Other", "olaf@example.test");
    otherSquadId = (await otherHead.call(squadsRoute, "POST", "/api/squads", { body: { name: "Other Squad" } })).json
      .id;

    const a = await joinAs(
      "Ada Athlete",
      "ada@example.test",
      await invite(head, squadId, "ada@example.test", "athlete"),
    );
    expect(a.response.status).toBe(200);
    athleteA = a.browser;
    athleteAId = (await athleteA.call(meRoute, "GET", "/api/me")).json.user.id;
    const b = await joinAs("Bo Athlete", "bo@example.test", await invite(head, squadId, "bo@example.test", "athlete"));
    athleteB = b.browser;
    athleteBId = (await athleteB.call(meRoute, "GET", "/api/me")).json.user.id;
    const c = await joinAs("Cai Coach", "cai@example.test", await invite(head, squadId, "cai@example.test", "coach"));
    expect(c.response.json).toMatchObject({ role: "coach" });
    coach = c.browser;
  });

  it("signs in with the right password and refuses a wrong one", async () => {
    const fresh = new Browser("198.51.100.20");
    expect((await fresh.signIn("hana@example.test", "wrong-password-123")).status).toBe(401);
    expect((await fresh.call(meRoute, "GET", "/api/me")).status).toBe(401);
    expect((await fresh.signIn("hana@example.test")).status).toBe(200);
    const me = await fresh.call(meRoute, "GET", "/api/me");
    expect(me.status).toBe(200);
    expect(me.json).toMatchObject({
      user: { email: "hana@example.test" },
      roles: ["head_coach"],
      squads: [{ name: "Harbour Squad", role: "head_coach" }],
    });
  });

  it("an invitation joins with the invited role, and works once", async () => {
    const me = await athleteA.call(meRoute, "GET", "/api/me");
    expect(me.json.squads).toEqual([{ id: squadId, name: "Harbour Squad", role: "athlete" }]);
    const token = await latestInvitationToken("ada@example.test");
    const again = await athleteA.call(acceptRoute, "POST", `/api/invitations/${token}/accept`, { params: { token } });
    expect(again.status).toBe(410);
    expect(again.json.error).toMatch(/already been used/);
  });

  it("an invitation for another address is refused and writes nothing", async () => {
    const token = await invite(head, squadId, "dee@example.test", "athlete");
    const stranger = new Browser();
    await stranger.signUp("Sam Stranger", "sam@example.test");
    const r = await stranger.call(acceptRoute, "POST", `/api/invitations/${token}/accept`, { params: { token } });
    expect(r.status).toBe(403);
    const rows = await query(
      `select 1 from membership m join "user" u on u.id = m.user_id where u.email = 'sam@example.test'`,
    );
    expect(rows).toHaveLength(0);
  });

  it("an expired invitation is refused with a clear message", async () => {
    const token = await invite(head, squadId, "eve@example.test", "athlete");
    await query(`update invitation set expires_at = now() - interval '1 minute' where email = 'eve@example.test'`);
    const { response } = await joinAs("Eve Late", "eve@example.test", token);
    expect(response.status).toBe(410);
    expect(response.json.error).toMatch(/expired/);
  });

  it("only the head coach invites", async () => {
    const r = await coach.call(invitationsRoute, "POST", `/api/squads/${squadId}/invitations`, {
      params: { id: squadId },
      body: { email: "x@example.test", role: "athlete" },
    });
    expect(r.status).toBe(403);
    const outsider = await otherHead.call(invitationsRoute, "POST", `/api/squads/${squadId}/invitations`, {
      params: { id: squadId },
      body: { email: "x@example.test", role: "athlete" },
    });
    expect(outsider.status).toBe(404);
  });

  it("roster visibility: head coach and coach see the squad's athletes; an athlete sees only self; another squad's coach sees none", async () => {
    const names = async (b: Browser) =>
      ((await b.call(athletesRoute, "GET", "/api/athletes")).json as { name: string }[]).map((a) => a.name);
    expect(await names(head)).toEqual(["Ada Athlete", "Bo Athlete"]);
    expect(await names(coach)).toEqual(["Ada Athlete", "Bo Athlete"]);
    expect(await names(athleteA)).toEqual(["Ada Athlete"]);
    expect(await names(otherHead)).toEqual([]);
    const scoped = await otherHead.call(athletesRoute, "GET", "/api/athletes", { query: `?squad=${squadId}` });
    expect(scoped.json).toEqual([]);
    const anonymous = await new Browser().call(athletesRoute, "GET", "/api/athletes");
    expect(anonymous.status).toBe(401);
    const shape = (await head.call(athletesRoute, "GET", "/api/athletes")).json[0];
    expect(Object.keys(shape).sort()).toEqual(["email", "id", "name", "sports"]);
    expect(otherSquadId).not.toBe(squadId);
  });

  it("an athlete cannot read or change another athlete's profile", async () => {
    const read = await athleteA.call(profileRoute, "GET", `/api/athletes/${athleteBId}/profile`, {
      params: { id: athleteBId },
    });
    expect(read.status).toBe(404);
    expect(JSON.stringify(read.json)).not.toContain("bo@example.test");
    const write = await athleteA.call(profileRoute, "PATCH", `/api/athletes/${athleteBId}/profile`, {
      params: { id: athleteBId },
      body: { bodyMassKg: 99 },
    });
    expect(write.status).toBe(404);
    const outsider = await otherHead.call(profileRoute, "GET", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
    });
    expect(outsider.status).toBe(404);
  });

  it("the athlete and their coaches read and update the profile", async () => {
    const own = await athleteA.call(profileRoute, "PATCH", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
      body: {
        timeZone: "Europe/Oslo",
        reminderTime: "06:15",
        reminderTiming: "morning_of",
        sports: ["running"],
        restingHrBpm: 50,
        maxHrBpm: 190,
      },
    });
    expect(own.status).toBe(200);
    const seen = await coach.call(profileRoute, "GET", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
    });
    expect(seen.json.profile).toMatchObject({
      timeZone: "Europe/Oslo",
      reminderTime: "06:15",
      sports: ["running"],
      restingHrBpm: 50,
    });
    const byCoach = await head.call(profileRoute, "PATCH", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
      body: { bodyMassKg: 61.5 },
    });
    expect(byCoach.status).toBe(200);
    expect(byCoach.json.profile).toMatchObject({ bodyMassKg: 61.5, timeZone: "Europe/Oslo" });
  });

  it("bad bodies get 400 with field errors and write nothing", async () => {
    const before = await query(`select * from athlete_profile where user_id = $1`, [athleteAId]);
    const bad = await athleteA.call(profileRoute, "PATCH", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
      body: { timeZone: "Mars/Olympus", reminderTime: "25:99", bodyMassKg: 5, restingHrBpm: 70 },
    });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.fieldErrors).sort()).toEqual(["bodyMassKg", "reminderTime", "timeZone"]);
    expect(bad.json.fieldErrors.timeZone[0]).toMatch(/time zone/i);
    const unknown = await athleteA.call(profileRoute, "PATCH", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
      body: { shoeSize: 42 },
    });
    expect(unknown.status).toBe(400);
    const notJson = await athleteA.call(profileRoute, "PATCH", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
      rawBody: "{not json",
    });
    expect(notJson.status).toBe(400);
    expect(notJson.json.error).toMatch(/not valid JSON/);
    const hrOrder = await athleteA.call(profileRoute, "PATCH", `/api/athletes/${athleteAId}/profile`, {
      params: { id: athleteAId },
      body: { restingHrBpm: 100, maxHrBpm: 100 },
    });
    expect(hrOrder.status).toBe(400);
    expect(hrOrder.json.fieldErrors.maxHrBpm).toBeDefined();
    const after = await query(`select * from athlete_profile where user_id = $1`, [athleteAId]);
    expect(after).toEqual(before);

    const badInvite = await head.call(invitationsRoute, "POST", `/api/squads/${squadId}/invitations`, {
      params: { id: squadId },
      body: { email: "not-an-address", role: "king" },
    });
    expect(badInvite.status).toBe(400);
    expect(Object.keys(badInvite.json.fieldErrors).sort()).toEqual(["email", "role"]);
    const badSquad = await head.call(squadsRoute, "POST", "/api/squads", { body: { name: "" } });
    expect(badSquad.status).toBe(400);
    expect(badSquad.json.fieldErrors.name).toBeDefined();
    const invitations = await query(`select 1 from invitation where email = 'not-an-address'`);
    expect(invitations).toHaveLength(0);
  });

  it("sign-up refuses a short password; a duplicate address creates nothing (the answer does not say it exists)", async () => {
    const b = new Browser();
    expect(
      (await b.auth("POST", "/sign-up/email", { name: "Short", email: "short@example.test", password: "short" }))
        .status,
    ).toBe(400);
    const before = await query(`select id from "user" where email = 'hana@example.test'`);
    await b.auth("POST", "/sign-up/email", {
      name: "Dup",
      email: "hana@example.test",
      password: "long-enough-password",
    });
    expect(await query(`select id from "user" where email = 'hana@example.test'`)).toEqual(before);
    expect((await new Browser("203.0.113.78").signIn("hana@example.test", "long-enough-password")).status).toBe(401);
  });

  it("password reset: the request writes a message with a link, the link sets a new password and ends the other sessions at once", async () => {
    // Another device, signed in before the reset and seen (so its session is remembered by the server) just before it.
    const other = new Browser("198.51.100.33");
    expect((await other.signIn("ada@example.test")).status).toBe(200);
    expect((await other.call(meRoute, "GET", "/api/me")).status).toBe(200);
    const b = new Browser("198.51.100.30");
    const r = await b.auth("POST", "/request-password-reset", {
      email: "ada@example.test",
      redirectTo: "/reset-password",
    });
    expect(r.status).toBe(200);
    const [msg] = await query<{ meta: { url: string } }>(
      `select meta from outbox where kind = 'password_reset' and to_address = 'ada@example.test'`,
    );
    expect(msg?.meta.url).toMatch(/\/api\/auth\/reset-password\//);
    const token = msg!.meta.url.split("/reset-password/")[1]!.split("?")[0]!;
    const reset = await b.auth("POST", "/reset-password", { newPassword: "a-brand-new-password", token });
    expect(reset.status).toBe(200);
    expect((await new Browser("198.51.100.31").signIn("ada@example.test", "a-brand-new-password")).status).toBe(200);
    expect((await new Browser("198.51.100.32").signIn("ada@example.test")).status).toBe(401);
    expect((await other.call(meRoute, "GET", "/api/me")).status).toBe(401);
  });

  it("a person changes their own name and password (the settings page's calls); a wrong current password changes nothing", async () => {
    const b = new Browser("198.51.100.40");
    await b.signUp("Mara Lind", "mara@example.test");
    const other = new Browser("198.51.100.41");
    expect((await other.signIn("mara@example.test")).status).toBe(200);
    expect((await other.call(meRoute, "GET", "/api/me")).status).toBe(200);
    expect((await b.auth("POST", "/update-user", { name: "Mara Lind-Holm" })).status).toBe(200);
    expect((await b.call(meRoute, "GET", "/api/me")).json.user.name).toBe("Mara Lind-Holm");
    // A name the sign-up would refuse is refused here too (auth.ts checks names on every change).
    expect((await b.auth("POST", "/update-user", { name: "x" })).status).toBeGreaterThanOrEqual(400);
    const wrong = await b.auth("POST", "/change-password", {
      currentPassword: "not-the-password",
      newPassword: "another-long-password",
      revokeOtherSessions: true,
    });
    expect(wrong.status).toBeGreaterThanOrEqual(400);
    expect((await new Browser("198.51.100.42").signIn("mara@example.test")).status).toBe(200);
    const right = await b.auth("POST", "/change-password", {
      currentPassword: "correct-horse-battery",
      newPassword: "another-long-password",
      revokeOtherSessions: true,
    });
    expect(right.status).toBe(200);
    expect((await new Browser("198.51.100.43").signIn("mara@example.test", "another-long-password")).status).toBe(200);
    expect((await new Browser("198.51.100.44").signIn("mara@example.test")).status).toBe(401);
    // The other device is signed out; this one stays signed in.
    expect((await other.call(meRoute, "GET", "/api/me")).status).toBe(401);
    expect((await b.call(meRoute, "GET", "/api/me")).status).toBe(200);
  });

  it("a person chooses imperial units: they hold at once, a bad value is refused, downloads follow the choice", async () => {
    const joined = await joinAs(
      "Una Units",
      "una@example.test",
      await invite(head, squadId, "una@example.test", "athlete"),
    );
    const una = joined.browser;
    const unaId = (await una.call(meRoute, "GET", "/api/me")).json.user.id as string;
    const display = (body?: unknown) =>
      una.call(displayRoute, body ? "PATCH" : "GET", "/api/me/display", body ? { body } : {});
    expect((await display()).json).toEqual({ units: "metric", dateStyle: "iso" });
    const bad = await display({ units: "furlongs" });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.json)).toContain("Choose metric or imperial.");
    const log = await una.call(logsRoute, "POST", `/api/athletes/${unaId}/logs`, {
      params: { id: unaId },
      body: {
        status: "done",
        clientKey: "6f1c2a0e-5b7d-4c1e-9a3f-2d8e7b6c5a41",
        date: "2027-02-10",
        sport: "running",
        title: "Ten miles",
        durationMin: 80,
        distanceKm: 16.09344,
        rpe: 4,
      },
    });
    expect(log.status).toBe(201);
    const csv = async () =>
      String(
        (
          await una.call(exportRoute, "GET", `/api/athletes/${unaId}/export/logs.csv`, {
            params: { id: unaId, file: "logs.csv" },
            query: "?from=2027-02-01&to=2027-02-28",
          })
        ).json,
      )
        .replace(/^\uFEFF/, "")
        .split("\r\n");
    expect((await csv())[0]).toContain("distance_km");
    expect((await display({ units: "imperial" })).status).toBe(200);
    // The next request reads the new choice (the remembered session forgets the old one at once).
    expect((await display()).json).toEqual({ units: "imperial", dateStyle: "iso" });
    const lines = await csv();
    expect(lines[0]).toContain("distance_mi");
    // 16.09344 km is 10 mi exactly (1 mi = 1609.344 m, NIST Handbook 44).
    expect(lines[1]).toContain(",10,");
    const [row] = await query<{ units: string }>(`select units from "user" where id = $1`, [unaId]);
    expect(row!.units).toBe("imperial");
  });

  it("a person chooses how dates read: it holds at once beside the units, a bad value or an empty change is refused", async () => {
    const joined = await joinAs(
      "Dora Dates",
      "dora@example.test",
      await invite(head, squadId, "dora@example.test", "athlete"),
    );
    const dora = joined.browser;
    const display = (body?: unknown) =>
      dora.call(displayRoute, body ? "PATCH" : "GET", "/api/me/display", body ? { body } : {});
    const bad = await display({ dateStyle: "yyyy/dd/mm" });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.json)).toContain("Choose how dates read");
    const empty = await display({});
    expect(empty.status).toBe(400);
    expect(JSON.stringify(empty.json)).toContain("Send units, dateStyle or both.");
    expect((await display({ units: "imperial" })).status).toBe(200);
    expect((await display({ dateStyle: "day-month" })).json).toEqual({ units: "imperial", dateStyle: "day-month" });
    // The units chosen before are kept; the next request reads both (the remembered session forgot the old ones).
    expect((await display()).json).toEqual({ units: "imperial", dateStyle: "day-month" });
    const userId = (await dora.call(meRoute, "GET", "/api/me")).json.user.id as string;
    const [row] = await query<{ date_style: string }>(`select date_style from "user" where id = $1`, [userId]);
    expect(row!.date_style).toBe("day-month");
  });

  it("a person moves their account to a new address: approved from the old one, confirmed from the new one, only then moved", async () => {
    const b = new Browser("198.51.100.60");
    await b.signUp("Eli Moss", "eli@example.test");
    const open = async (kind: string, to: string) => {
      const rows = await query<{ meta: { url: string } }>(
        `select meta from outbox where kind = $1 and to_address = $2 order by created_at desc limit 1`,
        [kind, to],
      );
      expect(rows[0], `${kind} to ${to}`).toBeTruthy();
      const url = new URL(rows[0]!.meta.url);
      return b.call(authRoute, "GET", url.pathname, { query: url.search });
    };
    const emailOf = async () =>
      (await query<{ email: string }>(`select email from "user" where name = 'Eli Moss'`))[0]!.email;
    expect((await b.auth("POST", "/change-email", { newEmail: "eli.moss@example.test" })).status).toBe(200);
    // Nothing has moved yet, and nothing went to the new address: the old one approves first.
    expect(await emailOf()).toBe("eli@example.test");
    expect(await query(`select 1 from outbox where to_address = 'eli.moss@example.test'`)).toHaveLength(0);
    expect((await open("email_change_confirmation", "eli@example.test")).status).toBeLessThan(400);
    expect(await emailOf()).toBe("eli@example.test");
    // The new address confirms itself, and the account moves.
    expect((await open("email_change_verification", "eli.moss@example.test")).status).toBeLessThan(400);
    expect(await emailOf()).toBe("eli.moss@example.test");
    expect((await new Browser("198.51.100.61").signIn("eli.moss@example.test")).status).toBe(200);
    expect((await new Browser("198.51.100.62").signIn("eli@example.test")).status).toBe(401);
    // This device, still signed in, reads the new address at once.
    expect((await b.call(meRoute, "GET", "/api/me")).json.user.email).toBe("eli.moss@example.test");
  });

  it("a signed-out session cookie, replayed, no longer signs anyone in", async () => {
    const b = new Browser("198.51.100.34");
    await b.signUp("Replay", "replay@example.test");
    expect((await b.call(meRoute, "GET", "/api/me")).status).toBe(200);
    const stolen = b.cookie;
    expect((await b.auth("POST", "/sign-out", {})).status).toBe(200);
    const thief = new Browser("198.51.100.35");
    thief.cookie = stolen;
    expect((await thief.call(meRoute, "GET", "/api/me")).status).toBe(401);
  });

  it("rate-limits repeated sign-in attempts from one address with 429", async () => {
    const b = new Browser("203.0.113.77");
    const statuses: number[] = [];
    // Different addresses each time, so that the per-account pause (security.test.ts) does not answer first.
    for (let i = 0; i < 10; i++)
      statuses.push((await b.signIn(`nobody-${i}@example.test`, "wrong-password-123")).status);
    expect(statuses.slice(0, 8).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(8)).toEqual([429, 429]);
  });
});
