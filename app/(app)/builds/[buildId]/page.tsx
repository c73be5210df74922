import { dehydrate, HydrationBoundary, QueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { buildQuery } from "@/components/builds/build-queries";
import { BuildWorkspace } from "@/components/builds/build-workspace";
import { SheetDownload } from "@/components/sheets/sheet-download";
import { Refused } from "@/components/shell/refused";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { BUILD_DONE, formatDate } from "@/lib/format";
import { predictionImages } from "@/lib/build/sheet";
import { getBuild, loadSignedRevision } from "@/lib/server/builds";
import { revisionEyewear } from "@/lib/server/eyewear";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Build" };

export default async function BuildPage({ params }: { params: Promise<{ buildId: string }> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { build: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { buildId } = await params;
  const db = getDb();
  const build = await getBuild(db, actor, buildId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  });
  const revision = await loadSignedRevision(db, actor, build.revision.id);
  const eyewear = rolesAllow(actor.roles, { eyewear: ["read"] }) ? await revisionEyewear(db, actor, build.revision.id) : null;
  const queryClient = new QueryClient();
  queryClient.setQueryData(buildQuery(buildId).queryKey, build);
  const valid = build.revision.status === "valid";
  return (
    <div className="flex flex-col gap-6">
      <Link href="/builds" className="text-sm">
        ← Benches to build
      </Link>
      <header className="flex flex-col gap-2">
        <p className="text-sm text-muted">{build.revision.labName} · build by {build.technicianName}, started {formatDate(build.startedAt)}</p>
        <h1 className="text-2xl font-semibold">{build.revision.benchTitle}</h1>
        <p>
          <span className="font-semibold">Revision {build.revision.number}</span> · signed off by {build.revision.signerName ?? "—"}
          {build.revision.decidedAt ? ` on ${formatDate(build.revision.decidedAt)}` : ""}
          {build.state === "completed" ? <span className="ml-2 text-ok">● {BUILD_DONE.done}</span> : <span className="ml-2 text-warn">◔ Build in progress</span>}
        </p>
        <p className={valid ? "text-muted" : "text-lg font-semibold text-danger"} role={valid ? undefined : "alert"}>
          {valid ? build.revision.statusSentence : `✕ ${build.revision.statusSentence}`}
        </p>
        {build.revision.conditions ? <p className="rounded-md border border-warn px-3 py-2">Conditions of the sign-off (each is a line of the checklist below): {build.revision.conditions}</p> : null}
        <p className="break-all font-mono text-sm text-muted">Content hash {build.contentHash}</p>
      </header>
      {valid ? <SheetDownload revisionId={build.revision.id} /> : null}
      <HydrationBoundary state={dehydrate(queryClient)}>
        <BuildWorkspace buildId={buildId} images={revision.document.version === 1 ? predictionImages(revision.document) : {}} eyewear={eyewear} />
      </HydrationBoundary>
    </div>
  );
}
