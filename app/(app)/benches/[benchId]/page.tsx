import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { Refused } from "@/components/shell/refused";
import { StateBadge } from "@/components/ui/state-badge";
import { AppError } from "@/lib/errors";
import { getBench } from "@/lib/server/benches";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Bench" };

export default async function BenchPage({ params }: { params: Promise<{ benchId: string }> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { benchId } = await params;
  const detail = await getBench(getDb(), actor, benchId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  });
  const current = detail.revisions[0];
  return (
    <div>
      <p className="text-sm text-muted">{detail.labName}</p>
      <h1 className="text-2xl font-semibold">{detail.title}</h1>
      <p className="mb-6 text-muted">By {detail.authorName}</p>
      <h2 className="mb-2 text-lg font-semibold">Revisions</h2>
      <ul className="mb-8 flex flex-col gap-2">
        {detail.revisions.map((r) => (
          <li key={r.id} className="flex flex-wrap items-center gap-3 rounded-lg border border-line bg-panel px-4 py-3">
            <span className="font-semibold">Revision {r.number}</span>
            <StateBadge state={r.state} />
            <span className="font-mono text-sm text-muted" title="Content hash (SHA-256 of the canonical bench document)">
              {r.contentHash}
            </span>
          </li>
        ))}
      </ul>
      {current ? (
        <>
          <h2 className="mb-2 text-lg font-semibold">Elements of revision {current.number}, in beam order</h2>
          <div className="overflow-x-auto rounded-lg border border-line">
            <table className="w-full text-left">
              <thead className="bg-raised text-sm text-muted">
                <tr>
                  <th className="px-3 py-2 font-medium">Position</th>
                  <th className="px-3 py-2 font-medium">Element</th>
                  <th className="px-3 py-2 font-medium">Settings</th>
                </tr>
              </thead>
              <tbody>
                {[...current.document.elements]
                  .sort((a, b) => a.positionMm - b.positionMm)
                  .map((e) => (
                    <tr key={e.id} className="border-t border-line">
                      <td className="px-3 py-2 font-mono">{e.positionMm} mm</td>
                      <td className="px-3 py-2">
                        {e.kind} <span className="text-muted">({e.id})</span>
                      </td>
                      <td className="px-3 py-2 text-sm">
                        {e.kind === "laser" && `${e.wavelengthNm} nm, ${e.powerMw} mW, ⌀ ${e.beamDiameterMm} mm (1/e²)${e.m2 ? `, M² ${e.m2}` : ""}`}
                        {e.kind === "lens" && `f = ${e.focalLengthMm} mm`}
                        {e.kind === "aperture" && `⌀ ${e.diameterMm} mm`}
                        {e.kind === "filter" && `OD ${e.opticalDensity}`}
                      </td>
                    </tr>
                  ))}
              </tbody>
            </table>
          </div>
        </>
      ) : null}
    </div>
  );
}
