"use client";
import Link from "next/link";
import { shownEmail } from "../lib/managed";
import { useMemo, useState } from "react";
import { useDates } from "@/features/platform/components/dates";
import { SPORT_LABELS } from "@/features/platform/lib/sports";
import type { RosterRow } from "@/features/roster/lib/roster";
import { useRoster } from "../api";

function sportLabel(s: string): string {
  return (SPORT_LABELS as Record<string, string>)[s] ?? s;
}

type SortKey = "name" | "zones" | "retest" | "week" | "compliance" | "load";
type Filter = "all" | "attention" | "over" | "retest" | "load";

/** How much a row needs the coach: over budget, overdue retest, load flag, drift, low compliance. */
function attention(r: RosterRow): number {
  return (
    (r.readiness?.holdHardSessions ? 3 : 0) +
    (r.readiness && r.readiness.status !== "ready" ? 1 : 0) +
    (r.week.overBudget ? 1 : 0) +
    (r.retestOverdue ? 1 : 0) +
    (r.loadFlag ? 1 : 0) +
    (r.drift ? 1 : 0) +
    (r.unreadMessages ? 1 : 0) +
    (r.compliance4w !== null && r.compliance4w < 0.7 ? 1 : 0)
  );
}

const compare: Record<SortKey, (a: RosterRow, b: RosterRow) => number> = {
  name: (a, b) => a.name.localeCompare(b.name),
  zones: (a, b) => (b.zoneSetAgeDays ?? 1e9) - (a.zoneSetAgeDays ?? 1e9),
  retest: (a, b) =>
    Number(b.retestOverdue) - Number(a.retestOverdue) || (a.nextRetest ?? "9999").localeCompare(b.nextRetest ?? "9999"),
  week: (a, b) => Number(b.week.overBudget) - Number(a.week.overBudget),
  compliance: (a, b) => (a.compliance4w ?? 2) - (b.compliance4w ?? 2),
  load: (a, b) => Number(!!b.loadFlag) - Number(!!a.loadFlag) || (b.acwr ?? 0) - (a.acwr ?? 0),
};

/** Which way each column sorts (what the header announces): attention first where a column is a state. */
const DIRECTION: Record<SortKey, { aria: "ascending" | "descending" | "other"; glyph: string; says: string }> = {
  name: { aria: "ascending", glyph: "▴", says: "A to Z" },
  zones: { aria: "descending", glyph: "▾", says: "oldest zones first" },
  retest: { aria: "ascending", glyph: "▴", says: "overdue first, then soonest" },
  week: { aria: "other", glyph: "•", says: "over budget first" },
  compliance: { aria: "ascending", glyph: "▴", says: "least done first" },
  load: { aria: "descending", glyph: "▾", says: "flagged first, then highest ratio" },
};

function Fill({ value, label }: { value: number | null; label: string }) {
  if (value === null) return <span className="text-ink-soft">nothing planned</span>;
  const pct = Math.round(value * 100);
  return (
    <span className="flex items-center gap-2">
      <span
        className="h-2 w-16 overflow-hidden rounded bg-ground"
        role="meter"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={Math.min(100, pct)}
      >
        <span className="block h-full bg-ink/70" style={{ width: `${Math.min(100, pct)}%` }} />
      </span>
      <span className="num">{pct} %</span>
    </span>
  );
}

export function RosterTable({ squadId }: { squadId: string }) {
  const { data, isPending, isError, error, refetch } = useRoster(squadId);
  const dates = useDates();
  const [sort, setSort] = useState<SortKey>("name");
  const [filter, setFilter] = useState<Filter>("all");
  const [search, setSearch] = useState("");
  const rows = useMemo(() => {
    const list = (data?.rows ?? []).filter((r) => {
      if (
        search &&
        !`${r.name} ${r.email} ${r.sports.map(sportLabel).join(" ")}`.toLowerCase().includes(search.toLowerCase())
      )
        return false;
      if (filter === "attention") return attention(r) > 0;
      if (filter === "over") return r.week.overBudget;
      if (filter === "retest") return r.retestOverdue;
      if (filter === "load") return !!r.loadFlag;
      return true;
    });
    return [...list].sort((a, b) => compare[sort](a, b) || a.name.localeCompare(b.name));
  }, [data, sort, filter, search]);

  if (isPending)
    return (
      <p role="status" className="py-6 text-ink-soft">
        Loading the roster…
      </p>
    );
  if (isError) {
    return (
      <div role="alert" className="rounded-md border border-alert/40 bg-alert-wash p-4 text-alert">
        The roster could not be loaded: {error.message}{" "}
        <button type="button" className="font-semibold underline" onClick={() => refetch()}>
          Try again
        </button>
      </div>
    );
  }
  if (data.rows.length === 0)
    return (
      <p className="py-6 text-ink-soft">
        No athletes in this squad yet. Invite your first athlete with the form beside the roster.
      </p>
    );
  const th = (key: SortKey, label: string) => (
    <th scope="col" className="py-2 pr-3 font-semibold" aria-sort={sort === key ? DIRECTION[key].aria : "none"}>
      <button
        type="button"
        className={`underline-offset-2 hover:underline ${sort === key ? "text-ink" : ""}`}
        onClick={() => setSort(key)}
      >
        {label}
        {sort === key ? (
          <>
            <span aria-hidden> {DIRECTION[key].glyph}</span>
            <span className="sr-only"> (sorted: {DIRECTION[key].says})</span>
          </>
        ) : null}
      </button>
    </th>
  );
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3 text-sm">
        <label className="block">
          <span className="field-label">Search</span>
          <input
            className="field-input"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            placeholder="Name, e-mail or sport"
          />
        </label>
        <label className="block">
          <span className="field-label">Show</span>
          <select className="field-input" value={filter} onChange={(e) => setFilter(e.target.value as Filter)}>
            <option value="all">All athletes</option>
            <option value="attention">Needing attention</option>
            <option value="over">Over budget this week</option>
            <option value="retest">Retest overdue</option>
            <option value="load">Load outside 0.8–1.3</option>
          </select>
        </label>
        <p className="num pb-2 text-ink-soft">
          {rows.length} of {data.rows.length} athletes
        </p>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left text-sm" aria-label="Athletes of the squad">
          <thead>
            <tr className="border-b border-rule text-ink-soft">
              {th("name", "Athlete")}
              <th scope="col" className="py-2 pr-3 font-semibold">
                Sports
              </th>
              {th("zones", "Zones set")}
              {th("retest", "Next retest")}
              {th("week", "This week")}
              {th("compliance", "Done, last 4 weeks")}
              {th("load", "Load (acute:chronic)")}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr
                key={r.id}
                className="border-b border-rule/70 align-top hover:bg-tide-wash/60"
                data-testid="roster-row"
              >
                <td className="py-2 pr-3">
                  {/* A squad may list hundreds: each athlete's page is fetched when followed, not all ahead. */}
                  <Link href={`/athletes/${r.id}`} prefetch={false} className="font-semibold text-tide hover:underline">
                    {r.name}
                  </Link>
                  <p className="text-xs text-ink-soft">{shownEmail(r.email)}</p>
                  {r.unreadMessages ? (
                    <p className="mt-1 text-xs">
                      <Link
                        href={`/athletes/${r.id}#messages`}
                        prefetch={false}
                        className="font-semibold text-tide underline"
                        data-testid="unread-messages"
                      >
                        {r.unreadMessages} new {r.unreadMessages === 1 ? "message" : "messages"}
                      </Link>
                    </p>
                  ) : null}
                  {r.drift ? (
                    <p className="mt-1 max-w-xs text-xs text-alert" data-testid="drift">
                      Zone drift: {r.drift.message}
                    </p>
                  ) : null}
                  {r.readiness && r.readiness.status !== "ready" ? (
                    <p
                      className={`mt-1 max-w-xs text-xs ${r.readiness.holdHardSessions ? "font-bold text-alert" : "text-alert"}`}
                      data-testid="readiness"
                    >
                      {r.readiness.label}
                    </p>
                  ) : null}
                  {r.readiness?.hrMedication ? (
                    <p className="mt-1 max-w-xs text-xs text-ink-soft">
                      Heart-rate-lowering medicine: use power, pace or RPE targets
                    </p>
                  ) : null}
                </td>
                <td className="py-2 pr-3">
                  {r.sports.length ? (
                    r.sports.map(sportLabel).join(", ")
                  ) : (
                    <span className="text-ink-soft">not set</span>
                  )}
                </td>
                <td className="num py-2 pr-3">
                  {r.zoneSetAgeDays === null ? (
                    <span className="text-ink-soft">no zones yet</span>
                  ) : r.zoneSetAgeDays < 14 ? (
                    `${r.zoneSetAgeDays} days ago`
                  ) : (
                    `${Math.round(r.zoneSetAgeDays / 7)} weeks ago`
                  )}
                </td>
                <td className="py-2 pr-3">
                  {r.retestOverdue ? (
                    <span className="rounded bg-alert-wash px-1 font-semibold text-alert" data-testid="retest-overdue">
                      Overdue
                    </span>
                  ) : null}
                  <span className="num">
                    {" "}
                    {r.nextRetest ? dates.day(r.nextRetest) : r.retestOverdue ? "" : "none planned"}
                  </span>
                  {r.retestNote ? <p className="text-xs text-ink-soft">{dates.text(r.retestNote)}</p> : null}
                </td>
                <td className="py-2 pr-3">
                  {r.week.overBudget ? (
                    <span className="font-semibold text-alert" title={r.week.flags.join(" ")}>
                      Over budget
                    </span>
                  ) : r.week.plannedMin ? (
                    "Within budget"
                  ) : (
                    <span className="text-ink-soft">nothing planned</span>
                  )}
                  <p className="num text-xs text-ink-soft">
                    {r.week.doneMin} of {r.week.plannedMin} min done
                  </p>
                </td>
                <td className="py-2 pr-3" data-testid="compliance">
                  <Fill value={r.compliance4w} label={`Share of planned time done by ${r.name}, last 4 weeks`} />
                </td>
                <td className="num py-2 pr-3">
                  {r.acwr === null ? <span className="text-ink-soft">not enough history</span> : r.acwr.toFixed(2)}
                  {r.loadFlag ? (
                    <p className="text-xs font-semibold text-alert">
                      {r.loadFlag === "high" ? "above" : "below"} the 0.8–1.3 band
                    </p>
                  ) : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
