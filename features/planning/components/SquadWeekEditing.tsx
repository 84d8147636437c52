"use client";
import { useRouter } from "next/navigation";
import { useState, type ReactNode } from "react";
import { useDates } from "@/features/platform/components/dates";
import { apiFetch, ApiError } from "@/features/platform/lib/api-client";
import { SPORT_LABELS, type Sport } from "@/features/platform/lib/sports";

/** The drag data type of a template chip (only this page's chips carry it), and its plain-text form. */
const TEMPLATE_TYPE = "application/x-tidemark-template";
const TEXT_PREFIX = "tidemark-template:";

/** The template id a drop carries, if it carries one. */
function droppedTemplate(dt: DataTransfer): string | null {
  const id = dt.getData(TEMPLATE_TYPE);
  if (id) return id;
  const text = dt.getData("text/plain");
  return text.startsWith(TEXT_PREFIX) ? text.slice(TEXT_PREFIX.length) : null;
}

interface TemplateOption {
  id: string;
  name: string;
  sport: string;
}

/** The squad's templates as chips to drag onto an athlete's day of the squad week. */
export function SquadTemplateStrip({ templates }: { templates: TemplateOption[] }) {
  if (!templates.length) return null;
  return (
    // Sticky at the top of the window, so that the chips stay in reach of every row while the table scrolls.
    <section
      aria-labelledby="squad-templates-title"
      className="sticky top-0 z-10 space-y-2 border-b border-rule bg-ground/95 py-2"
    >
      <h2 id="squad-templates-title" className="text-sm font-semibold">
        Templates: drag one onto an athlete&apos;s day, or use the day&apos;s “+ Plan” button
      </h2>
      <ul className="flex flex-wrap gap-2">
        {templates.map((t) => (
          <li
            key={t.id}
            draggable
            data-testid="squad-template"
            onDragStart={(e) => {
              e.dataTransfer.setData(TEMPLATE_TYPE, t.id);
              // Plain text too: some drag sources and tools pass only standard types.
              e.dataTransfer.setData("text/plain", `${TEXT_PREFIX}${t.id}`);
              e.dataTransfer.effectAllowed = "copy";
            }}
            className="cursor-grab rounded border border-rule bg-paper px-2 py-1 text-xs font-semibold"
          >
            {t.name} <span className="font-normal text-ink-soft">({SPORT_LABELS[t.sport as Sport] ?? t.sport})</span>
          </li>
        ))}
      </ul>
    </section>
  );
}

/**
 * One athlete's day in the squad week: its sessions (rendered by the page), a drop target for a template chip, and a
 * keyboard path ("+ Plan": choose a template, plan it). Planned through the squad's plan endpoint for this one athlete,
 * then the page reloads its rows and bands.
 */
/** Whether a drag may be dropped on a day: a template chip (by its own type, or plain text during the drag). */
const accepts = (dt: DataTransfer) => dt.types.includes(TEMPLATE_TYPE) || dt.types.includes("text/plain");

export function SquadDayCell({
  squadId,
  athlete,
  date,
  templates,
  children,
}: {
  squadId: string;
  athlete: { id: string; name: string; sports: string[] };
  date: string;
  templates: TemplateOption[];
  children: ReactNode;
}) {
  const router = useRouter();
  const dates = useDates();
  const shown = dates.day(date);
  const [over, setOver] = useState(false);
  const [open, setOpen] = useState(false);
  const [choice, setChoice] = useState(templates[0]?.id ?? "");
  const [status, setStatus] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  /** A template of another sport than the athlete trains, waiting for the coach's yes. */
  const [pending, setPending] = useState<TemplateOption | null>(null);
  const sportName = (s: string) => SPORT_LABELS[s as Sport]?.toLowerCase() ?? s;

  async function plan(templateId: string, confirmed = false) {
    const template = templates.find((t) => t.id === templateId);
    const name = template?.name ?? "The template";
    if (!confirmed && template && athlete.sports.length > 0 && !athlete.sports.includes(template.sport)) {
      setStatus(null);
      setPending(template);
      return;
    }
    setPending(null);
    setBusy(true);
    setStatus(null);
    try {
      await apiFetch(`/api/squads/${squadId}/plan`, {
        method: "POST",
        body: JSON.stringify({ mode: "template", templateId, date, athleteIds: [athlete.id] }),
      });
      setStatus({ ok: true, text: `Planned "${name}" for ${athlete.name} on ${shown}.` });
      setOpen(false);
      router.refresh();
    } catch (e) {
      setStatus({ ok: false, text: e instanceof ApiError ? e.message : "Planning failed." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <td
      className={`px-1 ${over ? "bg-tide/10 outline-2 outline-dashed outline-tide" : ""}`}
      data-testid="squad-day"
      data-date={date}
      onDragEnter={(e) => {
        if (accepts(e.dataTransfer)) e.preventDefault();
      }}
      onDragOver={(e) => {
        if (!accepts(e.dataTransfer)) return;
        e.preventDefault();
        e.dataTransfer.dropEffect = "copy";
        setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => {
        setOver(false);
        const id = droppedTemplate(e.dataTransfer);
        if (!id) return;
        e.preventDefault();
        void plan(id);
      }}
    >
      {children}
      {pending ? (
        <div
          role="alertdialog"
          aria-labelledby={`other-sport-${athlete.id}-${date}`}
          className="mt-1 space-y-1 text-xs"
        >
          <p id={`other-sport-${athlete.id}-${date}`}>
            &quot;{pending.name}&quot; is a {sportName(pending.sport)} template, and {athlete.name} trains{" "}
            {athlete.sports.map(sportName).join(", ")}. Plan it on {shown} anyway?
          </p>
          <div className="flex gap-1">
            <button
              type="button"
              className="btn px-2 py-0.5 text-xs"
              disabled={busy}
              onClick={() => plan(pending.id, true)}
            >
              Plan it anyway
            </button>
            <button type="button" className="btn-quiet px-2 py-0.5 text-xs" onClick={() => setPending(null)}>
              Do not plan it
            </button>
          </div>
        </div>
      ) : null}
      {templates.length ? (
        open ? (
          <div className="mt-1 space-y-1">
            <label className="sr-only" htmlFor={`plan-${athlete.id}-${date}`}>
              Template for {athlete.name} on {shown}
            </label>
            <select
              id={`plan-${athlete.id}-${date}`}
              className="field-input py-1 text-xs"
              value={choice}
              onChange={(e) => setChoice(e.target.value)}
            >
              {templates.map((t) => (
                <option key={t.id} value={t.id}>
                  {t.name}
                </option>
              ))}
            </select>
            <div className="flex gap-1">
              <button type="button" className="btn px-2 py-0.5 text-xs" disabled={busy} onClick={() => plan(choice)}>
                Plan it
              </button>
              <button type="button" className="btn-quiet px-2 py-0.5 text-xs" onClick={() => setOpen(false)}>
                Cancel
              </button>
            </div>
          </div>
        ) : (
          <button
            type="button"
            className="mt-1 rounded px-1 text-xs text-tide hover:underline"
            onClick={() => setOpen(true)}
          >
            + Plan
            <span className="sr-only">
              {" "}
              a template for {athlete.name} on {shown}
            </span>
          </button>
        )
      ) : null}
      <p role="status" className={`text-xs ${status?.ok === false ? "text-alert" : "sr-only"}`}>
        {status?.text ?? ""}
      </p>
    </td>
  );
}
