import { formatDay } from "@/features/platform/lib/date-format";
import Link from "next/link";
import { Fragment } from "react";
import { coachedSquadIds } from "@/features/access/lib/rules";
import { requirePageActor } from "@/features/access/server/current";
import { BudgetBand } from "@/features/planning/components/BudgetBand";
import { mondayOf } from "@/features/platform/lib/days";
import { addDays } from "@/features/platform/lib/days";
import { isoDate } from "@/features/planning/schemas";
import { squadWeek } from "@/features/planning/server";
import { listTemplates } from "@/features/planning/server/templates";
import { GroupPlanner } from "@/features/planning/components/GroupPlanner";
import { SquadDayCell, SquadTemplateStrip } from "@/features/planning/components/SquadWeekEditing";
import { describeMe } from "@/features/squads/server/squads";

export const metadata = { title: "Squad week" };

const DAY_NAMES = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"];
const LOG_MARK = { done: "✓ done", partial: "◐ partly done", skipped: "✗ skipped" } as const;

/** One week for every athlete of a squad: sessions day by day and each athlete's budget band. */
export default async function SquadWeekPage({
  searchParams,
}: {
  searchParams: Promise<{ squad?: string; week?: string }>;
}) {
  const actor = await requirePageActor("/roster/week");
  const q = await searchParams;
  const coached = new Set(coachedSquadIds(actor));
  const squads = (await describeMe(actor)).squads.filter((s) => coached.has(s.id));
  if (!squads.length) {
    return (
      <div className="mx-auto max-w-lg card space-y-3" role="alert">
        <h1 className="text-xl font-bold">The squad week is for coaches</h1>
        <p>Your account is not a coach of any squad, so there is no squad week to show.</p>
        <p>
          <Link href="/squads/new" className="btn-quiet">
            Start a squad of your own
          </Link>
        </p>
      </div>
    );
  }
  const squad = squads.find((s) => s.id === q.squad) ?? squads[0]!;
  const monday = mondayOf(q.week && isoDate.safeParse(q.week).success ? q.week : new Date().toISOString().slice(0, 10));
  const [rows, templates] = await Promise.all([
    squadWeek(actor, squad.id, monday),
    listTemplates(actor, { squadId: squad.id }),
  ]);
  const templateOptions = templates.map((t) => ({ id: t.id, name: t.name, sport: t.sport }));
  const days = Array.from({ length: 7 }, (_, i) => addDays(monday, i));
  const link = (week: string) => `/roster/week?squad=${squad.id}&week=${week}`;
  const over = rows.filter((r) => r.week.overBudget).length;
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-sm font-semibold uppercase tracking-widest text-tide">
            <Link href={`/roster?squad=${squad.id}`} className="hover:underline">
              {squad.name}
            </Link>
          </p>
          <h1 className="text-3xl font-bold">Week of {formatDay(monday, actor.dateStyle)}</h1>
          <p className="num text-sm text-ink-soft">
            {rows.length} athlete{rows.length === 1 ? "" : "s"} · {over} over budget
          </p>
        </div>
        <nav aria-label="Weeks" className="flex gap-2 text-sm">
          <Link href={link(addDays(monday, -7))} className="btn-quiet">
            ← Previous week
          </Link>
          <Link href={link(mondayOf(new Date().toISOString().slice(0, 10)))} className="btn-quiet">
            This week
          </Link>
          <Link href={link(addDays(monday, 7))} className="btn-quiet">
            Next week →
          </Link>
        </nav>
        <span className="flex flex-wrap gap-2">
          <a href={`/api/squads/${squad.id}/week?week=${monday}&format=csv`} className="btn-quiet text-sm" download>
            Download this week as CSV
          </a>
          <a href={`/api/squads/${squad.id}/week?week=${monday}&format=xlsx`} className="btn-quiet text-sm" download>
            Download this week as Excel (.xlsx)
          </a>
        </span>
      </div>
      {rows.length > 0 ? (
        <GroupPlanner
          squadId={squad.id}
          monday={monday}
          athletes={rows.map((r) => r.athlete)}
          templates={templateOptions}
        />
      ) : null}
      {rows.length > 0 ? <SquadTemplateStrip templates={templateOptions} /> : null}
      {rows.length === 0 ? (
        <p className="card text-ink-soft">No athletes in this squad yet. Invite them from the roster.</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full min-w-[56rem] table-fixed border-separate border-spacing-y-2 text-sm">
            <thead>
              <tr className="text-left text-ink-soft">
                <th scope="col" className="w-32 px-2">
                  Athlete
                </th>
                {days.map((d, i) => (
                  <th key={d} scope="col" className="px-2 font-semibold">
                    <span className="block">{DAY_NAMES[i]}</span>
                    <span className="num text-xs font-normal">{formatDay(d, actor.dateStyle, { year: false })}</span>
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <Fragment key={r.athlete.id}>
                  <tr className="align-top" data-testid="squad-week-row">
                    <th scope="row" className="px-2 text-left">
                      <Link
                        href={`/athletes/${r.athlete.id}/plan?week=${monday}`}
                        prefetch={false}
                        className="font-semibold text-tide hover:underline"
                      >
                        {r.athlete.name}
                      </Link>
                    </th>
                    {days.map((d) => (
                      <SquadDayCell key={d} squadId={squad.id} athlete={r.athlete} date={d} templates={templateOptions}>
                        <ul className="space-y-1">
                          {r.sessions
                            .filter((x) => x.date === d)
                            .map((x) => (
                              <li
                                key={x.id}
                                className={`rounded border px-1.5 py-1 ${x.minutesByZone[2] > 0 ? "border-zone-3" : "border-rule"} bg-paper`}
                              >
                                <p className="truncate font-semibold" title={x.title}>
                                  {x.kind === "retest" ? "⟳ " : ""}
                                  {x.title}
                                </p>
                                <p className="num text-xs text-ink-soft">
                                  {Math.round(x.totalS / 60)} min · z3 {Math.round(x.minutesByZone[2])} min
                                </p>
                                {x.log ? <p className="text-xs">{LOG_MARK[x.log]}</p> : null}
                              </li>
                            ))}
                        </ul>
                      </SquadDayCell>
                    ))}
                  </tr>
                  <tr>
                    <td />
                    <td colSpan={7} className="px-1 pb-3">
                      <BudgetBand week={r.week} />
                    </td>
                  </tr>
                </Fragment>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
