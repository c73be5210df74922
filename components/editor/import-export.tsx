"use client";
// JSON export of the bench document (the contract format) and import, checked with the shared schema.
import { useRef, useState } from "react";
import { benchDocumentSchema, describeIssues, type BenchDocument, type FieldProblem } from "@/lib/bench/schema";

type Props = { doc: BenchDocument; canEdit: boolean; onImport: (doc: BenchDocument) => void };

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 60) || "bench";

export function ImportExport({ doc, canEdit, onImport }: Props) {
  const input = useRef<HTMLInputElement>(null);
  const [problems, setProblems] = useState<{ file: string; list: FieldProblem[] } | null>(null);

  const exportJson = () => {
    const ordered = { version: doc.version, ...(doc.title !== undefined ? { title: doc.title } : {}), elements: doc.elements };
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
    const result = benchDocumentSchema.safeParse(parsed);
    if (!result.success) {
      setProblems({ file: file.name, list: describeIssues(result.error) });
      return;
    }
    setProblems(null);
    onImport(result.data);
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
