import Link from "next/link";
import { coachedSquadIds } from "@/features/access/lib/rules";
import { requirePageActor } from "@/features/access/server/current";
import { TemplateBuilder } from "@/features/planning/components/TemplateBuilder";
import { TemplateList } from "@/features/planning/components/TemplateList";
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
      <TemplateList templates={templates} />
      <section className="card space-y-3" aria-labelledby="new-tpl">
        <h2 id="new-tpl" className="text-lg font-bold">
          Build a template
        </h2>
        <TemplateBuilder squadId={squads[0]!} />
      </section>
    </div>
  );
}
