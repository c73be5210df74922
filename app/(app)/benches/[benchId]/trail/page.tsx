import { notFound } from "next/navigation";
import { getDb } from "@/db";
import { Refused } from "@/components/shell/refused";
import { BenchTrailView } from "@/components/trail/bench-trail";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { pageActor, refusal } from "@/lib/server/page-guard";
import { getReaderTrail } from "@/lib/server/trail";

export const metadata = { title: "Bench trail" };

export default async function BenchTrailPage({ params }: { params: Promise<{ benchId: string }> }) {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const { benchId } = await params;
  const trail = await getReaderTrail(getDb(), actor, benchId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) notFound();
    throw error;
  });
  const exportHref = rolesAllow(actor.roles, { audit: ["export"] }) ? `/api/desk/benches/${trail.bench.id}/trail/export` : undefined;
  return <BenchTrailView trail={trail} exportHref={exportHref} />;
}
