import { existsSync } from "node:fs";
import path from "node:path";
import Link from "next/link";
import { getDb } from "@/db";
import { ApprovalsTable } from "@/components/desk/approvals-table";
import { DeskFilters } from "@/components/desk/desk-filters";
import { Refused } from "@/components/shell/refused";
import { rolesAllow } from "@/lib/auth/permissions";
import { deskFilterOptions, deskQueryFromParams, deskQueryKeepingGoodFilters, listApprovals } from "@/lib/server/desk";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Sign-off desk" };

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

export default async function DeskPage({ searchParams }: { searchParams: SearchParams }) {
  const actor = await pageActor();
  const refused = refusal(actor, { audit: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const raw = await searchParams;
  const { query, dropped } = deskQueryKeepingGoodFilters(deskQueryFromParams(raw));
  const now = new Date();
  const [page, options] = await Promise.all([listApprovals(getDb(), actor, query, now), deskFilterOptions(getDb(), actor)]);
  const exportParams = new URLSearchParams();
  const droppedNames = new Set(dropped.map((d) => d.field));
  for (const [k, v] of Object.entries(raw)) if (typeof v === "string" && v && !["page", "pageSize", "sort", "dir"].includes(k) && !droppedNames.has(k)) exportParams.set(k, v);
  const mayExport = rolesAllow(actor.roles, { audit: ["export"] });
  const verifyExists = existsSync(path.join(process.cwd(), "app/(app)/verify"));

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-semibold">Sign-off desk</h1>
          <p className="max-w-3xl text-muted">
            Every sign-off: who signed which revision (its content hash), when, with which conditions, and whether it is still in force. Read-only. Open a bench for its whole trail.
          </p>
        </div>
        <div className="flex flex-wrap gap-3">
          {verifyExists ? (
            <Link href="/verify" className="inline-flex min-h-11 items-center rounded-md border border-line px-4 py-2 text-text no-underline hover:bg-raised">
              Check a printed sheet
            </Link>
          ) : null}
          {mayExport ? (
            <a
              href={`/api/desk/approvals/export${exportParams.size ? `?${exportParams}` : ""}`}
              download
              className="inline-flex min-h-11 items-center rounded-md bg-accent px-4 py-2 font-semibold text-ink no-underline hover:bg-accent-strong"
              data-testid="export-approvals"
            >
              Export these sign-offs (CSV)
            </a>
          ) : null}
        </div>
      </div>
      {dropped.length > 0 ? (
        <p role="alert" className="rounded-md border border-danger p-3 text-danger" data-testid="desk-dropped-filters">
          {dropped.length === 1 ? "One filter in the address could not be read and is left out" : `${dropped.length} filters in the address could not be read and are left out`}:{" "}
          {dropped.map((d) => `“${d.field}” (${d.message})`).join("; ")}. The other filters still apply.
        </p>
      ) : null}
      <DeskFilters key={JSON.stringify(query)} labs={options.labs} officers={options.officers} />
      <ApprovalsTable rows={page.rows} total={page.total} mismatchTotal={page.mismatchTotal} page={page.page} pageSize={page.pageSize} pageCount={page.pageCount} sort={query.sort} dir={query.dir} nowIso={now.toISOString()} />
      {mayExport ? <p className="text-sm text-muted">The export holds every sign-off that matches the filters (not only this page), newest first; each export is recorded in the audit trail.</p> : null}
    </div>
  );
}
