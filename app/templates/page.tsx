import Link from "next/link";
import { coachedSquadIds } from "@/features/access/lib/rules";
import { requirePageActor } from "@/features/access/server/current";
import { TemplatesWorkspace } from "@/features/planning/components/TemplatesWorkspace";
import { listTemplates } from "@/features/planning/server/templates";

export const metadata = { title: "Session templates" };

export default async function TemplatesPage() {
  const actor = await requirePageActor("/templates");
  const squads = coachedSquadIds(actor);
  if (!squads.length) {
    return (
      <div className="mx-auto max-w-lg card">
        <h1 className="text-xl font-bold">Templates are for coaches</h1>
        <p className="mt-2">
          <Link href="/home" className="text-tide underline">
            Go to your home
          </Link>
        </p>
      </div>
    );
  }
  const templates = await listTemplates(actor);
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-bold">Session templates</h1>
      <TemplatesWorkspace squadId={squads[0]!} templates={templates} />
    </div>
  );
}
