"use client";
// JSON export of the bench document (the contract format, either version) and import, checked with the shared schema.
// A file of the other version (a table into a rail bench, or back) replaces the working draft on the server at once
// and the page opens it afresh, since one editor holds one version.
import { useRef, useState } from "react";
import { putDraft } from "@/lib/api/bench-queries";
import { describeIssues, type AnyBenchDocument, type FieldProblem } from "@/lib/bench/schema";
import { anyBenchDocumentSchema } from "@/lib/bench/schema-v2";

type Props<D extends AnyBenchDocument> = {
  doc: D;
  canEdit: boolean;
  onImport: (doc: D) => void;
  /** The bench and the draft the editor's work is based on: needed to save a file of the other version straight away. */
  benchId?: string;
  base?: { revisionNumber: number; version: number };
};

/** The document as the export writes it: version first, then title, table (version 2) and elements. */
export function exportedDocument(doc: AnyBenchDocument): Record<string, unknown> {
  return {
    version: doc.version,
    ...(doc.title !== undefined ? { title: doc.title } : {}),
    ...(doc.version === 2 ? { table: doc.table } : {}),
    elements: doc.elements,
  };
}

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 60) || "bench";

export function ImportExport<D extends AnyBenchDocument>({ doc, canEdit, onImport, benchId, base }: Props<D>) {
  const input = useRef<HTMLInputElement>(null);
  const [problems, setProblems] = useState<{ file: string; list: FieldProblem[] } | null>(null);

  const exportJson = () => {
    const ordered = exportedDocument(doc);
    const blob = new Blob([JSON.stringify(ordered, null, 2) + "\n"], { type: "application/json" });
    const url = URL.createObjectURL(blob);
    const a = document.createElement("a");
    a.href = url;
    a.download = `${slug(doc.title ?? "bench")}.bench.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  const importFile = async (file: File) => {
    let parsed: unknown;
    try {
      parsed = JSON.parse(await file.text());
    } catch {
      setProblems({ file: file.name, list: [{ path: "(file)", message: "The file is not valid JSON." }] });
      return;
    }
    const result = anyBenchDocumentSchema.safeParse(parsed);
    if (!result.success) {
      setProblems({ file: file.name, list: describeIssues(result.error) });
      return;
    }
    setProblems(null);
    if (result.data.version === doc.version) {
      onImport(result.data as D);
      return;
    }
    const other = result.data.version === 2 ? "an optical table (version 2)" : "a straight rail (version 1)";
    if (!benchId || !base) {
      setProblems({ file: file.name, list: [{ path: "version", message: `The file is ${other}; this editor holds version ${doc.version} only.` }] });
      return;
    }
    try {
      const outcome = await putDraft(benchId, { document: result.data, baseRevision: base.revisionNumber, baseVersion: base.version });
      if (outcome.kind === "conflict") {
        setProblems({ file: file.name, list: [{ path: "(bench)", message: `${outcome.message} Reload the page and import the file again.` }] });
        return;
      }
      window.location.reload();
    } catch (error) {
      setProblems({ file: file.name, list: [{ path: "(server)", message: error instanceof Error ? error.message : "The server did not take the file." }] });
    }
  };

  return (
    <div className="flex flex-col items-end gap-2">
      <div className="flex gap-2">
        <button type="button" onClick={exportJson} className="min-h-10 rounded-md border border-line px-3 text-sm hover:bg-raised">
          Export JSON
        </button>
        {canEdit ? (
          <>
            <button type="button" onClick={() => input.current?.click()} className="min-h-10 rounded-md border border-line px-3 text-sm hover:bg-raised">
              Import JSON…
            </button>
            <input
              ref={input}
              type="file"
              accept="application/json,.json"
              className="sr-only"
              aria-label="Bench document to import"
              data-testid="import-file"
              onChange={(e) => {
                const file = e.target.files?.[0];
                if (file) void importFile(file);
                e.target.value = "";
              }}
            />
          </>
        ) : null}
      </div>
      {problems ? (
        <div role="alert" className="w-full max-w-md rounded-md border border-danger bg-panel p-3 text-sm" data-testid="import-problems">
          <p className="font-medium">“{problems.file}” was not imported; nothing changed:</p>
          <ul className="mt-1 list-disc pl-5">
            {problems.list.map((p, i) => (
              <li key={`${p.path}-${i}`}>
                <span className="font-mono text-muted">{p.path}</span>: {p.message}
              </li>
            ))}
          </ul>
          <button type="button" className="mt-2 text-accent underline" onClick={() => setProblems(null)}>
            Dismiss
          </button>
        </div>
      ) : null}
    </div>
  );
}
