"use client";
import { useMemo, useState, type Ref } from "react";
import { SPORT_LABELS, type Sport } from "@/features/platform/lib/sports";
import type { TrayTemplate } from "./PlanCalendar";

const ZONE_BG = ["bg-zone-1", "bg-zone-2", "bg-zone-3"] as const;
const ZONE_FILTERS = {
  any: "Any zones",
  easy: "Zone 1 only",
  z2: "With zone 2",
  z3: "With zone 3",
} as const;
type ZoneFilter = keyof typeof ZONE_FILTERS;

const sportLabel = (s: string) => SPORT_LABELS[s as Sport] ?? s.replaceAll("_", " ");

/** A template's minutes per zone as one flat strip: widths are the minutes, colours the zones. */
export function ZoneStrip({ minutesByZone }: { minutesByZone: [number, number, number] }) {
  const total = minutesByZone.reduce((a, b) => a + b, 0) || 1;
  return (
    <div className="flex h-2.5 w-full overflow-hidden rounded-sm border border-ink" aria-hidden>
      {minutesByZone.map((m, z) =>
        m > 0 ? (
          <div
            key={z}
            className={`${ZONE_BG[z]} border-r border-ink last:border-r-0`}
            style={{ width: `${(100 * m) / total}%` }}
          />
        ) : null,
      )}
    </div>
  );
}

/**
 * The template tray as a dock along the bottom of the window: it stays in reach while the calendar scrolls, folds away,
 * and finds a template by name, sport and the zones it holds, the athlete's own sports first. Each card can be dragged
 * onto a day, or chosen with the keyboard (Enter) to plan it with the form.
 */
export function TemplateDock({
  templates,
  athleteSports,
  listRef,
  onChoose,
}: {
  templates: TrayTemplate[];
  athleteSports: string[];
  /** The list the calendar's drag source is bound to (kept mounted while folded). */
  listRef: Ref<HTMLUListElement>;
  onChoose: (templateId: string) => void;
}) {
  // null: as the screen suits (on a phone the open tray would cover half the screen, so it starts folded there; CSS
  // decides, so server and browser render the same); true or false once the coach folds or opens it.
  const [chosen, setChosen] = useState<boolean | null>(null);
  const auto = chosen === null;
  const open = chosen ?? true;
  const toggle = () => setChosen((c) => !(c ?? window.matchMedia("(min-width: 768px)").matches));
  const hideOnPhone = auto ? "max-md:hidden" : "";
  const [query, setQuery] = useState("");
  const [sport, setSport] = useState<string>("all");
  const [zones, setZones] = useState<ZoneFilter>("any");
  const own = useMemo(() => new Set(athleteSports), [athleteSports]);
  const sports = useMemo(() => [...new Set(templates.map((t) => t.sport))].sort(), [templates]);
  const shown = useMemo(() => {
    const q = query.trim().toLowerCase();
    return templates
      .filter((t) => !q || t.name.toLowerCase().includes(q))
      .filter((t) =>
        sport === "all" ? true : sport === "mine" ? own.size === 0 || own.has(t.sport) : t.sport === sport,
      )
      .filter((t) => {
        const [, z2, z3] = t.minutesByZone;
        if (zones === "easy") return z2 === 0 && z3 === 0;
        if (zones === "z2") return z2 > 0;
        if (zones === "z3") return z3 > 0;
        return true;
      })
      .sort((a, b) => Number(own.has(b.sport)) - Number(own.has(a.sport)) || a.name.localeCompare(b.name));
  }, [templates, query, sport, zones, own]);

  return (
    <section
      aria-labelledby="tray-heading"
      className="sticky bottom-0 z-30 -mx-4 border-t border-rule bg-paper/95 px-4 py-2 shadow-[0_-4px_12px_rgba(0,0,0,0.08)] backdrop-blur"
      data-testid="template-dock"
    >
      <div className="flex flex-wrap items-center gap-x-3 gap-y-2">
        <h2 id="tray-heading" className="font-bold">
          Template tray
        </h2>
        <span className="text-xs text-ink-soft" aria-live="polite">
          {shown.length} of {templates.length}
        </span>
        {open ? (
          <div className={`contents ${hideOnPhone}`}>
            <label className="sr-only" htmlFor="tray-search">
              Search templates
            </label>
            <input
              id="tray-search"
              type="search"
              className="field-input mt-0 w-44 py-1"
              placeholder="Search templates"
              value={query}
              onChange={(e) => setQuery(e.target.value)}
            />
            <label className="sr-only" htmlFor="tray-sport">
              Sport
            </label>
            <select
              id="tray-sport"
              className="field-input mt-0 w-auto py-1"
              value={sport}
              onChange={(e) => setSport(e.target.value)}
            >
              <option value="mine">The athlete&apos;s sports</option>
              <option value="all">All sports</option>
              {sports.map((s) => (
                <option key={s} value={s}>
                  {sportLabel(s)}
                </option>
              ))}
            </select>
            <label className="sr-only" htmlFor="tray-zones">
              Zones
            </label>
            <select
              id="tray-zones"
              className="field-input mt-0 w-auto py-1"
              value={zones}
              onChange={(e) => setZones(e.target.value as ZoneFilter)}
            >
              {Object.entries(ZONE_FILTERS).map(([k, label]) => (
                <option key={k} value={k}>
                  {label}
                </option>
              ))}
            </select>
            <span className="hidden text-xs text-ink-soft xl:inline">
              Drag onto a day (the week&apos;s band shows the result first), or press Enter on a card.
            </span>
          </div>
        ) : null}
        {auto ? (
          <>
            <button
              type="button"
              className="btn-quiet ml-auto py-1 text-sm md:hidden"
              aria-expanded={false}
              aria-controls="tray-list"
              onClick={toggle}
            >
              Open the tray
            </button>
            <button
              type="button"
              className="btn-quiet ml-auto py-1 text-sm max-md:hidden"
              aria-expanded={true}
              aria-controls="tray-list"
              onClick={toggle}
            >
              Fold the tray
            </button>
          </>
        ) : (
          <button
            type="button"
            className="btn-quiet ml-auto py-1 text-sm"
            aria-expanded={open}
            aria-controls="tray-list"
            onClick={toggle}
          >
            {open ? "Fold the tray" : "Open the tray"}
          </button>
        )}
      </div>
      {templates.length === 0 && open ? (
        <p className="mt-2 text-sm text-ink-soft">No templates yet. Build one on the templates page.</p>
      ) : null}
      {open && templates.length > 0 && shown.length === 0 ? (
        <p className="mt-2 text-sm text-ink-soft">No template matches. Clear the search or choose all sports.</p>
      ) : null}
      <ul id="tray-list" ref={listRef} hidden={!open} className={`mt-2 flex gap-2 overflow-x-auto pb-1 ${hideOnPhone}`}>
        {shown.map((t) => (
          <li
            key={t.id}
            data-template-id={t.id}
            data-title={t.name}
            data-sport={t.sport}
            tabIndex={0}
            aria-label={`${t.name}, ${sportLabel(t.sport)}, ${Math.round(t.totalS / 60)} min: zone 1 ${Math.round(t.minutesByZone[0])}, zone 2 ${Math.round(t.minutesByZone[1])}, zone 3 ${Math.round(t.minutesByZone[2])} min. Press Enter to plan it with the form.`}
            onKeyDown={(e) => {
              if (e.key === "Enter" || e.key === " ") {
                e.preventDefault();
                onChoose(t.id);
              }
            }}
            className="w-52 shrink-0 cursor-grab space-y-1 rounded-md border border-rule bg-paper p-2 text-sm shadow-sm hover:border-tide focus:outline-2 focus:outline-tide"
          >
            <p className="truncate font-semibold" title={t.name}>
              {t.name}
            </p>
            <ZoneStrip minutesByZone={t.minutesByZone} />
            <p className="num text-xs text-ink-soft">
              {Math.round(t.totalS / 60)} min · z1 {Math.round(t.minutesByZone[0])} · z2{" "}
              {Math.round(t.minutesByZone[1])} · z3 {Math.round(t.minutesByZone[2])}
              {own.size && !own.has(t.sport) ? <span className="text-alert"> · {sportLabel(t.sport)}</span> : null}
            </p>
          </li>
        ))}
      </ul>
    </section>
  );
}
