export default function Loading() {
  return (
    <p role="status" className="text-muted">
      Loading…
    </p>
  );
}
