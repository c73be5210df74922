"use client";
import { formatDate, formatDateTime } from "@/lib/format";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { Button } from "@/components/ui/button";
import { StateBadge } from "@/components/ui/state-badge";
import type { ApprovalRow, DeskSort } from "@/lib/server/desk";
import { useDeskUrl } from "./use-desk-url";

const DAY_MS = 86_400_000;
const column = createColumnHelper<ApprovalRow>();
const utc = (iso: string) => formatDateTime(iso);

function validity(row: ApprovalRow, nowMs: number) {
  if (!row.validUntil) return <span className="text-muted">—</span>;
  const days = Math.ceil((Date.parse(row.validUntil) - nowMs) / DAY_MS);
  const when = formatDate(row.validUntil);
  if (row.state !== "approved") return <span className="text-muted">{when}</span>;
  if (days <= 30) {
    return (
      <span className="text-warn">
        {when}
        <span className="block text-sm">
          <span aria-hidden="true">▲ </span>
          {days <= 0 ? "ends today" : `${days} day${days === 1 ? "" : "s"} left`}
        </span>
      </span>
    );
  }
  return (
    <span>
      {when}
      <span className="block text-sm text-muted">{days} days left</span>
    </span>
  );
}

/** What the builds of the signed revision found: a mismatch is flagged in words with its count, not by colour alone. */
function buildWords(row: ApprovalRow) {
  if (row.builds === 0) return <span className="text-sm text-muted">Not built yet</span>;
  const builds = `${row.builds} build${row.builds === 1 ? "" : "s"}`;
  if (row.mismatches === 0) return <span className="text-sm text-muted">{builds}; nothing recorded differs from the prediction</span>;
  const photo = row.photoMismatches === 0 ? "" : row.photoMismatches === row.mismatches ? (row.mismatches === 1 ? ", read from a screen photo" : ", all read from screen photos") : `, ${row.photoMismatches} read from a screen photo`;
  return (
    <span className="text-warn" data-testid="desk-mismatch">
      <span aria-hidden="true">▲ </span>
      {row.mismatches === 1 ? "1 observation differs" : `${row.mismatches} observations differ`} from the prediction
      <span className="block text-sm">
        {builds}
        {photo}
      </span>
    </span>
  );
}

/** The sign-offs table: sorting and paging are done by the server, the table only draws and asks. */
export function ApprovalsTable({
  rows,
  total,
  mismatchTotal,
  page,
  pageSize,
  pageCount,
  sort,
  dir,
  nowIso,
}: {
  rows: ApprovalRow[];
  total: number;
  mismatchTotal: number;
  page: number;
  pageSize: number;
  pageCount: number;
  sort: DeskSort;
  dir: "asc" | "desc";
  nowIso: string;
}) {
  const { params, update, pending } = useDeskUrl();
  const onlyMismatches = params.get("builds") === "mismatch";
  const nowMs = Date.parse(nowIso);
  const columns = [
    column.accessor("title", {
      id: "title",
      header: "Bench",
      cell: (c) => (
        <span>
          <Link href={`/desk/benches/${c.row.original.benchId}`} className="font-medium">
            {c.getValue()}
          </Link>
          <span className="block font-mono text-sm text-muted" title={`Content hash ${c.row.original.contentHash}`}>
            rev. {c.row.original.number} · {c.row.original.contentHash.slice(0, 12)}
          </span>
        </span>
      ),
    }),
    column.accessor("labName", { id: "lab", header: "Lab" }),
    column.accessor("hazardClass", { id: "class", header: "Class", cell: (c) => (c.getValue() ? `Class ${c.getValue()}` : "—") }),
    column.accessor("signerName", { id: "officer", header: "Signed by" }),
    column.accessor("decidedAt", { id: "decidedAt", header: "Signed", cell: (c) => <span className="whitespace-nowrap text-sm">{utc(c.getValue())}</span> }),
    column.accessor("validUntil", { id: "validUntil", header: "Valid until", cell: (c) => validity(c.row.original, nowMs) }),
    column.accessor("state", { id: "state", header: "State now", enableSorting: false, cell: (c) => <StateBadge state={c.getValue()} /> }),
    column.accessor("mismatches", { id: "builds", header: "Builds", enableSorting: false, cell: (c) => buildWords(c.row.original) }),
    column.accessor("conditions", {
      id: "conditions",
      header: "Conditions",
      enableSorting: false,
      cell: (c) => (c.getValue() ? <span className="line-clamp-3 text-sm">{c.getValue()}</span> : <span className="text-sm text-muted">None</span>),
    }),
  ];
  const sorting: SortingState = [{ id: sort, desc: dir === "desc" }];
  // TanStack Table returns functions the React Compiler cannot memoise; this app does not use the compiler.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    pageCount,
    rowCount: total,
    state: { sorting, pagination: { pageIndex: page - 1, pageSize } },
    enableSortingRemoval: false,
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const first = next[0];
      if (first) update({ sort: first.id, dir: first.desc ? "desc" : "asc" });
    },
    onPaginationChange: (updater) => {
      const next = typeof updater === "function" ? updater({ pageIndex: page - 1, pageSize }) : updater;
      update({ page: next.pageIndex + 1, pageSize: next.pageSize }, next.pageSize !== pageSize);
    },
    getRowId: (r) => r.decisionId,
  });

  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);

  return (
    <div className="flex flex-col gap-3" aria-busy={pending}>
      <p role="status" className="text-muted" data-testid="desk-count">
        {total === 0 ? "No sign-off matches these filters." : `Showing ${first}–${last} of ${total} sign-off${total === 1 ? "" : "s"}.`}
      </p>
      {mismatchTotal > 0 && !onlyMismatches ? (
        <p className="flex flex-wrap items-center gap-3 rounded-md border border-warn p-3 text-warn" data-testid="desk-mismatch-total">
          <span>
            <span aria-hidden="true">▲ </span>
            {mismatchTotal === 1 ? "1 of these sign-offs has a build" : `${mismatchTotal} of these sign-offs have a build`} whose observation (typed, or read from a screen photo) differs from the prediction.
          </span>
          <Button type="button" variant="quiet" onClick={() => update({ builds: "mismatch" })} disabled={pending}>
            Show only those
          </Button>
        </p>
      ) : null}
      <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className={`overflow-x-auto rounded-lg border border-line ${pending ? "opacity-60" : ""}`}>
        <table className="w-full text-left" data-testid="approvals-table">
          <caption className="sr-only">Sign-offs, {sort} {dir === "asc" ? "ascending" : "descending"}</caption>
          <thead className="bg-raised text-sm text-muted">
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  return (
                    <th key={h.id} className="px-3 py-2 font-medium" aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}>
                      {h.column.getCanSort() ? (
                        <button type="button" className="inline-flex min-h-11 items-center gap-1 text-left hover:text-text" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden="true">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-t border-line align-top">
                {r.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-3">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages" className="flex flex-wrap items-center gap-3">
        <Button type="button" variant="quiet" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage() || pending}>
          ← Previous page
        </Button>
        <span className="text-muted">
          Page {page} of {pageCount}
        </span>
        <Button type="button" variant="quiet" onClick={() => table.nextPage()} disabled={!table.getCanNextPage() || pending}>
          Next page →
        </Button>
        <label className="ml-auto flex items-center gap-2 text-sm text-muted">
          Rows per page
          <select className="min-h-11 rounded-md border border-line bg-ink px-2 text-text" value={pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
            {[10, 25, 50, 100].map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
      </nav>
    </div>
  );
}
