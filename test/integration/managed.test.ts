// Athletes without an e-mail address yet: a coach sets up a managed profile, records a test for it at once, and later
// hands it over to the athlete's address; the athlete chooses a password from the link and the profile is theirs.
import { beforeAll, describe, expect, it } from "vitest";
import * as addRoute from "@/app/api/squads/[id]/athletes/route";
import * as handOverRoute from "@/app/api/athletes/[id]/hand-over/route";
import * as testsRoute from "@/app/api/athletes/[id]/tests/route";
import * as rosterRoute from "@/app/api/roster/route";
import * as meRoute from "@/app/api/me/route";
import * as screeningRoute from "@/app/api/athletes/[id]/screening/route";
import { SCREENING_QUESTIONS } from "@/features/athlete-tests/lib/readiness";
import { queueMessage } from "@/features/messages/server";
import { getDb } from "@/db/client";
import { Browser } from "../support/api";
import { query, resetDatabase } from "../support/db";
import { makeSquad } from "../support/squad";

type Squad = Awaited<ReturnType<typeof makeSquad>>;
let s: Squad;
let other: Squad;

beforeAll(async () => {
  await resetDatabase();
  s = await makeSquad("managed");
  other = await makeSquad("managed-other");
});

const add = (who: Browser, body: unknown, squadId = s.squadId) =>
  who.call(addRoute, "POST", `/api/squads/${squadId}/athletes`, { params: { id: squadId }, body });
const handOver = (who: Browser, id: string, email: string) =>
  who.call(handOverRoute, "POST", `/api/athletes/${id}/hand-over`, { params: { id }, body: { email } });

describe("managed profiles", () => {
  it("a coach adds an athlete without an address, records a test for them, and nothing is e-mailed to them", async () => {
    const made = await add(s.coach.browser, { name: "Tove Lind", sports: ["running"] });
    expect(made.status).toBe(201);
    const id = made.json.id as string;
    const roster = await s.head.browser.call(rosterRoute, "GET", "/api/roster", { query: `?squad=${s.squadId}` });
    const row = roster.json.rows.find((r: { id: string }) => r.id === id);
    expect(row).toMatchObject({ name: "Tove Lind" });
    expect(row.email).toMatch(/@athletes\.invalid$/);
    // The coach records a field test on the spot (readiness answered for them first, as a lab would ask).
    const answers = Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, false]));
    const screened = await s.coach.browser.call(screeningRoute, "PUT", `/api/athletes/${id}/screening`, {
      params: { id },
      body: { answers },
    });
    expect(screened.status).toBe(200);
    const test = await s.coach.browser.call(testsRoute, "POST", `/api/athletes/${id}/tests`, {
      params: { id },
      body: {
        kind: "manual",
        meta: { sport: "running", protocol: "lab report", date: "2027-02-01", endedBy: "plan" },
        vt1: { hrBpm: 150, speedKmh: 11 },
        vt2: { hrBpm: 172, speedKmh: 13.5 },
      },
    });
    expect(test.status).toBe(201);
    // A message to the placeholder is never queued (RFC 2606 .invalid).
    expect(
      await queueMessage(getDb(), { kind: "test", to: row.email, subject: "x", text: "x", html: "<p>x</p>" }),
    ).toBeNull();
    expect(await query(`select 1 from outbox where to_address = $1`, [row.email])).toHaveLength(0);
  });

  it("bad input and the wrong people are refused", async () => {
    expect((await add(s.coach.browser, { name: "x", sports: ["running"] })).status).toBe(400);
    expect((await add(s.coach.browser, { name: "Nils Berg", sports: [] })).status).toBe(400);
    expect((await add(s.coach.browser, { name: "Nils Berg", sports: ["curling"] })).status).toBe(400);
    expect((await add(s.athleteA.browser, { name: "Nils Berg", sports: ["running"] })).status).toBe(403);
    expect((await add(other.head.browser, { name: "Nils Berg", sports: ["running"] })).status).toBe(404);
    // An athlete with an account of their own is not handed over by a coach.
    expect((await handOver(s.head.browser, s.athleteA.id, "new@example.test")).status).toBe(409);
  });

  it("handed over to the athlete's address, the link chooses a password and the profile becomes their account", async () => {
    const made = await add(s.head.browser, { name: "Ari Holm", sports: ["cycling"] });
    const id = made.json.id as string;
    expect((await handOver(other.head.browser, id, "ari@example.test")).status).toBe(404);
    expect((await handOver(s.head.browser, id, s.athleteA.email)).status).toBe(409);
    const r = await handOver(s.head.browser, id, "ari@example.test");
    expect(r.status).toBe(200);
    const [mail] = await query<{ subject: string; meta: { url: string } }>(
      `select subject, meta from outbox where kind = 'managed_hand_over' and to_address = 'ari@example.test'`,
    );
    expect(mail!.subject).toMatch(/Your coach set up your Tidemark profile/);
    // Before a password is chosen, the profile cannot sign in.
    const ari = new Browser("198.51.100.90");
    expect((await ari.signIn("ari@example.test", "a-long-new-password")).status).toBeGreaterThanOrEqual(400);
    const token = new URL(mail!.meta.url).pathname.split("/").pop()!;
    const reset = await ari.auth("POST", "/reset-password", { token, newPassword: "a-long-new-password" });
    expect(reset.status).toBe(200);
    expect((await ari.signIn("ari@example.test", "a-long-new-password")).status).toBe(200);
    const me = await ari.call(meRoute, "GET", "/api/me");
    expect(me.status).toBe(200);
    expect(me.json.user).toMatchObject({ id, email: "ari@example.test" });
    const [u] = await query<{ managed: boolean; email_verified: boolean }>(
      `select managed, email_verified from "user" where id = $1`,
      [id],
    );
    expect(u).toEqual({ managed: false, email_verified: true });
    const [p] = await query<{ remind_sessions: boolean }>(
      `select remind_sessions from athlete_profile where user_id = $1`,
      [id],
    );
    expect(p!.remind_sessions).toBe(true);
  });
});
