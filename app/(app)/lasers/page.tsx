import Link from "next/link";
import { getDb } from "@/db";
import { LaserTable } from "@/components/register/laser-table";
import { Refused } from "@/components/shell/refused";
import { rolesAllow } from "@/lib/auth/permissions";
import { pageActor, refusal } from "@/lib/server/page-guard";
import { listLasers } from "@/lib/server/register";

export const metadata = { title: "Laser register" };

export default async function LasersPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { register: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const lasers = await listLasers(getDb(), actor);
  const mismatches = lasers.filter((l) => l.computed.matchesLabel === false).length;
  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-semibold">Laser register</h1>
          <p className="text-muted">
            {actor.allLabs ? "Every lab's lasers." : "The lasers of your labs."} The estimate is Benchwarden&apos;s class at maximum power (IEC 60825-1:2014 limits); the label is never changed by it.
          </p>
        </div>
        {rolesAllow(actor.roles, { register: ["manage"] }) ? (
          <Link href="/lasers/new" className="inline-flex min-h-11 items-center rounded-md bg-accent px-4 py-2 font-semibold text-ink no-underline hover:bg-accent-strong">
            Register a laser
          </Link>
        ) : null}
      </div>
      {mismatches > 0 ? (
        <p role="status" className="rounded-md border border-warn p-3 text-warn">
          <span aria-hidden="true">▲ </span>
          {mismatches === 1 ? "One laser's label class differs" : `${mismatches} lasers' label classes differ`} from the estimate. The laser safety officer should check the datasheet or a measurement.
        </p>
      ) : null}
      <LaserTable lasers={lasers} />
    </div>
  );
}
