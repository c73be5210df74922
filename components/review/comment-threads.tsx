"use client";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { apiFetch, ApiError } from "@/lib/api/client";
import type { CommentThread } from "@/lib/api/contracts/reviews";
import { utc } from "./format";

type ElementOption = { id: string; label: string };

function CommentForm({ revisionId, parentId, elements, onDone, label }: { revisionId: string; parentId?: string; elements?: ElementOption[]; onDone?: () => void; label: string }) {
  const router = useRouter();
  const [body, setBody] = useState("");
  const [elementId, setElementId] = useState("");
  const post = useMutation({
    mutationFn: () =>
      apiFetch(`/api/revisions/${revisionId}/comments`, { method: "POST", body: JSON.stringify({ body, parentId, elementId: parentId ? undefined : elementId || undefined }) }),
    onSuccess: () => {
      setBody("");
      setElementId("");
      onDone?.();
      router.refresh();
    },
  });
  const id = parentId ? `reply-${parentId}` : "new-comment";
  return (
    <form
      className="flex flex-col gap-2"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        post.mutate();
      }}
    >
      <label htmlFor={id} className="text-sm font-medium text-muted">
        {label}
      </label>
      <textarea id={id} rows={parentId ? 2 : 3} value={body} onChange={(e) => setBody(e.target.value)} className="rounded-md border border-line bg-ink px-3 py-2 text-base text-text" />
      <div className="flex flex-wrap items-end gap-2">
        {elements ? (
          <div className="flex flex-col gap-1">
            <label htmlFor="comment-element" className="text-sm text-muted">
              About
            </label>
            <select id="comment-element" value={elementId} onChange={(e) => setElementId(e.target.value)} className="min-h-11 rounded-md border border-line bg-ink px-3 text-text">
              <option value="">The whole bench</option>
              {elements.map((e) => (
                <option key={e.id} value={e.id}>
                  {e.label}
                </option>
              ))}
            </select>
          </div>
        ) : null}
        <Button type="submit" variant="quiet" disabled={post.isPending || body.trim() === ""}>
          {parentId ? "Answer" : "Add the comment"}
        </Button>
      </div>
      {post.error instanceof ApiError ? (
        <p role="alert" className="text-sm text-danger">
          {post.error.message}
        </p>
      ) : null}
    </form>
  );
}

/** Comment threads on a revision, general or pinned to an element, with replies. */
export function CommentThreads({ revisionId, threads, elements, mayComment }: { revisionId: string; threads: CommentThread[]; elements: ElementOption[]; mayComment: boolean }) {
  const [replying, setReplying] = useState<string | null>(null);
  return (
    <div className="flex flex-col gap-3" data-testid="comment-threads">
      {threads.length === 0 ? <p className="text-muted">No comments yet.</p> : null}
      {threads.map((t) => (
        <article key={t.id} className="rounded-lg border border-line bg-panel p-3">
          <p className="mb-2 text-sm text-muted">{t.elementId ? `◎ About ${t.elementId}` : "General"}</p>
          <ol className="flex flex-col gap-3">
            {t.comments.map((c) => (
              <li key={c.id} className={c.parentId ? "border-l-2 border-line pl-3" : ""}>
                <p className="text-sm">
                  <span className="font-medium">{c.authorName}</span> <span className="text-muted">· {c.authorRole} · {utc(c.createdAt)}</span>
                </p>
                <p className="whitespace-pre-wrap">{c.body}</p>
              </li>
            ))}
          </ol>
          {mayComment ? (
            replying === t.id ? (
              <div className="mt-3">
                <CommentForm revisionId={revisionId} parentId={t.comments[t.comments.length - 1].id} label="Your answer" onDone={() => setReplying(null)} />
              </div>
            ) : (
              <button type="button" className="mt-2 text-sm text-accent underline" onClick={() => setReplying(t.id)}>
                Answer this thread
              </button>
            )
          ) : null}
        </article>
      ))}
      {mayComment ? (
        <div className="rounded-lg border border-line p-3">
          <CommentForm revisionId={revisionId} elements={elements} label="New comment" />
        </div>
      ) : null}
    </div>
  );
}
