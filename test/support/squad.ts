/** Builds a squad with a head coach, a coach and two athletes through the real route handlers. */
import * as acceptRoute from "@/app/api/invitations/[token]/accept/route";
import * as meRoute from "@/app/api/me/route";
import * as invitationsRoute from "@/app/api/squads/[id]/invitations/route";
import * as squadsRoute from "@/app/api/squads/route";
import * as screeningRoute from "@/app/api/athletes/[id]/screening/route";
import { SCREENING_QUESTIONS } from "@/features/athlete-tests/lib/readiness";
import { Browser } from "./api";
import { query } from "./db";

let counter = 0;

async function tokenFor(email: string): Promise<string> {
  const rows = await query<{ meta: { url: string } }>(
    `select meta from outbox where kind = 'invitation' and to_address = $1 order by created_at desc limit 1`,
    [email],
  );
  return rows[0]!.meta.url.split("/invite/")[1]!;
}

export interface Member {
  browser: Browser;
  id: string;
  email: string;
}

async function join(
  head: Browser,
  squadId: string,
  name: string,
  email: string,
  role: "athlete" | "coach",
): Promise<Member> {
  const r = await head.call(invitationsRoute, "POST", `/api/squads/${squadId}/invitations`, {
    params: { id: squadId },
    body: { email, role },
  });
  if (r.status !== 201) throw new Error(`invite failed ${r.status}`);
  const token = await tokenFor(email);
  const b = new Browser();
  await b.signUp(name, email);
  const a = await b.call(acceptRoute, "POST", `/api/invitations/${token}/accept`, { params: { token } });
  if (a.status !== 200) throw new Error(`accept failed ${a.status}`);
  const me = await b.call(meRoute, "GET", "/api/me");
  const id = me.json.user.id as string;
  if (role === "athlete") {
    // Readiness answered, all no: tests may be recorded (test/integration/screening tests the other answers).
    const answers = Object.fromEntries(SCREENING_QUESTIONS.map((q) => [q.id, false]));
    const put = await b.call(screeningRoute, "PUT", `/api/athletes/${id}/screening`, {
      params: { id },
      body: { answers },
    });
    if (put.status !== 200) throw new Error(`screening failed ${put.status}`);
  }
  return { browser: b, id, email };
}

export async function makeSquad(label = "s") {
  const n = ++counter;
  const tag = `${label}${n}${Date.now().toString(36)}`;
  const head = new Browser();
  const headUser = await head.signUp(`Head ${tag}`, `head-${tag}@example.test`);
  const squad = await head.call(squadsRoute, "POST", "/api/squads", { body: { name: `Squad ${tag}` } });
  const squadId = squad.json.id as string;
  const coach = await join(head, squadId, `Coach ${tag}`, `coach-${tag}@example.test`, "coach");
  const athleteA = await join(head, squadId, `Athlete A ${tag}`, `a-${tag}@example.test`, "athlete");
  const athleteB = await join(head, squadId, `Athlete B ${tag}`, `b-${tag}@example.test`, "athlete");
  return { squadId, head: { browser: head, id: headUser.id, email: headUser.email }, coach, athleteA, athleteB };
}
