import Link from "next/link";
import { redirect } from "next/navigation";
import { currentActor, homeFor } from "@/features/access/server/current";

export default async function Landing() {
  const actor = await currentActor();
  if (actor) redirect(homeFor(actor));
  return (
    <div className="grid gap-10 md:grid-cols-[3fr_2fr] md:items-center">
      <section>
        <p className="text-sm font-semibold uppercase tracking-widest text-tide">
          For endurance coaches and their athletes
        </p>
        <h1 className="mt-3 text-4xl font-bold leading-tight">
          From a threshold test to a season that keeps its intensity budget.
        </h1>
        <p className="mt-4 max-w-xl text-lg text-ink-soft">
          Test an athlete with a talk test or a gas-exchange ramp, find VT1 and VT2, derive personal zones in heart
          rate, power and pace, and plan weeks that stay mostly easy with a little hard. Athletes see today&apos;s
          session in their own numbers; weeks that break the budget are flagged; the retest comes round every 12–16
          weeks.
        </p>
        <div className="mt-6 flex flex-wrap gap-3">
          <Link href="/sign-in" className="btn">
            Sign in
          </Link>
          <Link href="/sign-up" className="btn-quiet">
            Create a coach account
          </Link>
        </div>
      </section>
      <aside className="card" aria-label="How a week is checked">
        <p className="text-sm font-semibold">A week against its budget</p>
        <div
          className="mt-3 flex h-6 overflow-hidden rounded border border-ink"
          role="img"
          aria-label="Example week: zone 1 80 %, zone 2 8 %, zone 3 12 %"
        >
          <div className="border-r border-ink bg-zone-1" style={{ width: "80%" }} />
          <div className="border-r border-ink bg-zone-2" style={{ width: "8%" }} />
          <div className="bg-zone-3" style={{ width: "12%" }} />
        </div>
        <dl className="mt-3 grid grid-cols-3 gap-2 text-sm">
          <div>
            <dt className="text-ink-soft">Zone 1</dt>
            <dd className="num font-semibold">80 %</dd>
          </div>
          <div>
            <dt className="text-ink-soft">Zone 2</dt>
            <dd className="num font-semibold">8 %</dd>
          </div>
          <div>
            <dt className="text-ink-soft">Zone 3</dt>
            <dd className="num font-semibold">12 %</dd>
          </div>
        </dl>
        <p className="mt-3 text-xs text-ink-soft">Example figures, not an athlete&apos;s data.</p>
      </aside>
    </div>
  );
}
