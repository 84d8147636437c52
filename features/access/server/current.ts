import "server-only";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { findActor, type SignedInActor } from "./permissions";

/** The signed-in user for a page, or null. */
export async function currentActor(): Promise<SignedInActor | null> {
  return findActor(await headers());
}

/** The signed-in user for a page; otherwise off to sign-in, coming back here afterwards. */
export async function requirePageActor(returnTo: string): Promise<SignedInActor> {
  const actor = await currentActor();
  if (!actor) redirect(`/sign-in?next=${encodeURIComponent(returnTo)}`);
  return actor;
}

/** Where a user belongs after signing in. */
export function homeFor(actor: SignedInActor): string {
  if (actor.memberships.some((m) => m.role === "head_coach" || m.role === "coach")) return "/roster";
  if (actor.memberships.some((m) => m.role === "athlete")) return "/today";
  return "/squads/new";
}
