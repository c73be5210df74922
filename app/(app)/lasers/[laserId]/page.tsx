import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { ClassCheck } from "@/components/register/class-check";
import { LaserForm } from "@/components/register/laser-form";
import { LaserStatusBadge } from "@/components/register/laser-status-badge";
import { pulseText } from "@/components/register/laser-table";
import { fmt, utc } from "@/components/review/format";
import { Refused } from "@/components/shell/refused";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { listLabs } from "@/lib/server/people";
import { pageActor, refusal } from "@/lib/server/page-guard";
import { getLaser, listResponsibleCandidates } from "@/lib/server/register";
import { HazardNotes } from "@/components/ui/hazard-notes";
import { plainText } from "@/lib/format";

export const metadata = { title: "Laser" };

export default async function LaserPage({ params }: { params: Promise<{ laserId: string }> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { register: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { laserId } = await params;
  let laser;
  try {
    laser = await getLaser(getDb(), actor, laserId);
  } catch (error) {
    if (error instanceof AppError && error.status === 404) notFound();
    if (error instanceof AppError) return <Refused reason={error.message} />;
    throw error;
  }
  const manage = rolesAllow(actor.roles, { register: ["manage"] });
  const [labs, people] = manage ? await Promise.all([listLabs(getDb(), actor), listResponsibleCandidates(getDb(), actor)]) : [[], []];
  const facts: [string, React.ReactNode][] = [
    ["Lab", laser.labName],
    ["Location", laser.location ?? "—"],
    ["Serial number", laser.serialNumber ?? "—"],
    ["Responsible person", laser.responsibleName ?? "Nobody named yet"],
    ["Wavelengths", `${laser.wavelengthsNm.map((w) => fmt(w, 4)).join(", ")} nm`],
    ["Maximum power", `${fmt(laser.maxPowerMw)} mW`],
    ["Pulses", pulseText(laser) ?? "Continuous-wave"],
    ["Further lines", laser.lines?.length ? laser.lines.map((l) => `${fmt(l.wavelengthNm, 4)} nm at ${fmt(l.powerMw)} mW`).join("; ") : "None recorded"],
    ["Beam diameter (1/e²)", `${fmt(laser.beamDiameterMm)} mm`],
    ["Divergence (1/e², full angle)", `${fmt(laser.divergenceMrad)} mrad`],
    ["Last changed", `${utc(laser.updatedAt)} · version ${laser.version}`],
  ];
  return (
    <div className="flex flex-col gap-6">
      <p>
        <Link href="/lasers">← Laser register</Link>
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">{laser.model}</h1>
        <LaserStatusBadge status={laser.status} />
      </div>
      <section aria-labelledby="class-heading" className="rounded-xl border border-line bg-panel p-5">
        <h2 id="class-heading" className="mb-2 text-lg font-semibold">
          Class
        </h2>
        <ClassCheck labelClass={laser.labelClass} computed={laser.computed} long />
        <ul className="mt-3 list-disc pl-5 text-sm text-muted">
          {laser.computed.reasons.map((r) => (
            <li key={r}>{plainText(r)}</li>
          ))}
        </ul>
        {laser.computed.source ? (
          <p className="mt-2 text-xs text-muted" data-testid="class-source">
            {plainText(laser.computed.source)}
          </p>
        ) : null}
        <div className="mt-3">
          <HazardNotes />
        </div>
      </section>
      <dl className="grid gap-x-6 gap-y-3 rounded-xl border border-line bg-panel p-5 sm:grid-cols-2">
        {facts.map(([k, val]) => (
          <div key={k}>
            <dt className="text-sm text-muted">{k}</dt>
            <dd>{val}</dd>
          </div>
        ))}
      </dl>
      {manage ? (
        <section aria-labelledby="edit-heading" className="flex flex-col gap-3">
          <h2 id="edit-heading" className="text-lg font-semibold">
            Change the entry
          </h2>
          <LaserForm labs={labs} people={people} initial={laser} laserId={laser.id} version={laser.version} />
        </section>
      ) : null}
    </div>
  );
}
