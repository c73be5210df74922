"use client";
// Upload a photo of the bench or of the screen, or a datasheet: PNG, JPEG or PDF up to 10 MB. The server
// checks the file's content, not its name, and answers a refusal with a sentence shown here.
import { useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { useUpload } from "./build-queries";

const KINDS = [
  { value: "screen-photo", label: "Photo of the screen" },
  { value: "bench-photo", label: "Photo of the built bench" },
  { value: "datasheet", label: "Datasheet (PDF)" },
];

export function UploadForm({ buildId, defaultKind = "screen-photo", id }: { buildId: string; defaultKind?: string; id: string }) {
  const upload = useUpload(buildId);
  const [kind, setKind] = useState(defaultKind);
  const fileRef = useRef<HTMLInputElement>(null);
  return (
    <form
      className="flex flex-col gap-2"
      data-testid={`upload-form-${id}`}
      onSubmit={(e) => {
        e.preventDefault();
        const file = fileRef.current?.files?.[0];
        if (file) upload.mutate({ file, kind }, { onSuccess: () => { if (fileRef.current) fileRef.current.value = ""; } });
      }}
    >
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col gap-1 text-sm text-muted">
          What it shows
          <select value={kind} onChange={(e) => setKind(e.target.value)} className="min-h-11 rounded-md border border-line bg-ink px-2 text-base text-text">
            {KINDS.map((k) => (
              <option key={k.value} value={k.value}>
                {k.label}
              </option>
            ))}
          </select>
        </label>
        <label className="flex min-w-0 max-w-full flex-col gap-1 text-sm text-muted">
          File (PNG, JPEG or PDF, at most 10 MB)
          <input ref={fileRef} type="file" accept="image/png,image/jpeg,application/pdf" className="min-h-11 max-w-full text-base text-text" aria-label={`File to upload (${id})`} />
        </label>
        <Button type="submit" variant="quiet" disabled={upload.isPending}>
          {upload.isPending ? "Uploading…" : "Upload"}
        </Button>
      </div>
      {upload.error ? <p role="alert" className="text-danger">{upload.error.message}</p> : null}
      {upload.isSuccess ? <p role="status" className="text-ok">✓ Kept, with its SHA-256 fingerprint.</p> : null}
    </form>
  );
}
