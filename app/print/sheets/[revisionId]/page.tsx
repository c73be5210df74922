import { notFound, redirect } from "next/navigation";
import { getDb } from "@/db";
import { PrintSheet } from "@/components/sheets/print-sheet";
import { rolesAllow } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { currentActor } from "@/lib/server/authorize";
import { sheetContent } from "@/lib/server/build-sheets";
import { revisionEyewear } from "@/lib/server/eyewear";
import { refusal } from "@/lib/server/page-guard";

// The page puppeteer prints into the build sheet PDF (lib/server/build-sheets.ts). It needs a session:
// the job passes the requesting user's cookie. ?paper=A4|Letter.
export const dynamic = "force-dynamic";
export const metadata = { title: "Build sheet" };

export default async function PrintSheetPage({ params, searchParams }: { params: Promise<{ revisionId: string }>; searchParams: Promise<{ paper?: string }> }) {
  const actor = await currentActor();
  if (!actor) redirect("/sign-in");
  const refused = refusal(actor, { bench: ["read"] });
  if (refused) return <p>{refused}</p>;
  const { revisionId } = await params;
  const paper = (await searchParams).paper === "Letter" ? "Letter" : "A4";
  const sheet = await sheetContent(getDb(), actor, revisionId).catch((error: unknown) => {
    if (error instanceof AppError && error.status === 404) notFound();
    if (error instanceof AppError) return error.message;
    throw error;
  });
  if (typeof sheet === "string") return <p>{sheet}</p>;
  const eyewear = rolesAllow(actor.roles, { eyewear: ["read"] }) ? await revisionEyewear(getDb(), actor, revisionId).catch(() => null) : null;
  return <PrintSheet sheet={sheet} paper={paper} eyewear={eyewear} />;
}
