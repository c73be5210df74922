export function Refused({ reason }: { reason: string }) {
  return (
    <div role="alert" className="rounded-xl border border-danger bg-panel p-6">
      <h1 className="text-xl font-semibold">Not open to your role</h1>
      <p className="mt-2 text-muted">{reason}</p>
    </div>
  );
}
