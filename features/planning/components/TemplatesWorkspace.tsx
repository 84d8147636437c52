"use client";
import { useState } from "react";
import type { Block } from "../lib/session";
import type { TemplateView } from "../lib/views";
import { TemplateBuilder, type TemplateToEdit } from "./TemplateBuilder";
import { TemplateList } from "./TemplateList";

/** The templates page: the builder at the top (new, or the template being edited), the library below. */
export function TemplatesWorkspace({ squadId, templates }: { squadId: string; templates: TemplateView[] }) {
  const [editing, setEditing] = useState<TemplateToEdit | null>(null);
  return (
    <div className="space-y-6">
      <section className="card space-y-3" aria-labelledby="tpl-builder-h">
        <h2 id="tpl-builder-h" className="text-lg font-bold">
          {editing ? `Edit "${editing.name}"` : "Build a template"}
        </h2>
        <TemplateBuilder
          key={editing ? `${editing.id}-${editing.version}` : "new"}
          squadId={squadId}
          editing={editing}
          onDone={() => setEditing(null)}
        />
      </section>
      <section aria-labelledby="tpl-library-h" className="space-y-3">
        <h2 id="tpl-library-h" className="text-lg font-bold">
          The squad&apos;s templates
        </h2>
        <TemplateList
          templates={templates}
          onEdit={(t) => {
            setEditing({
              id: t.id,
              version: t.version,
              name: t.name,
              sport: t.sport,
              description: t.description,
              structure: t.structure as Block[],
            });
            document.getElementById("tpl-builder-h")?.scrollIntoView({ block: "start" });
          }}
        />
      </section>
    </div>
  );
}
