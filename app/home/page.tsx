import { redirect } from "next/navigation";
import { homeFor, requirePageActor } from "@/features/access/server/current";

export default async function Home() {
  const actor = await requirePageActor("/home");
  redirect(homeFor(actor));
}
