"use client";

export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  // Server errors arrive without their message in production; say something useful anyway.
  const forbidden = /may not|not a member/.test(error.message);
  return (
    <div role="alert" className="rounded-xl border border-danger bg-panel p-6">
      <h1 className="text-xl font-semibold">{forbidden ? "This is not open to your role" : "Something went wrong"}</h1>
      <p className="mt-2 text-muted">
        {forbidden ? error.message : "Nothing was changed. Try again; if it keeps happening, tell your administrator."}
        {error.digest ? ` (reference ${error.digest})` : null}
      </p>
      <button type="button" onClick={reset} className="mt-4 min-h-11 rounded-md border border-line px-4 hover:bg-raised">
        Try again
      </button>
    </div>
  );
}
