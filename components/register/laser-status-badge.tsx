import type { LaserStatus } from "@/db/schema";

const LOOK: Record<LaserStatus, { label: string; shape: string; className: string }> = {
  "in-service": { label: "In service", shape: "●", className: "border-ok text-ok" },
  "out-of-service": { label: "Out of service", shape: "⏸", className: "border-warn text-warn" },
  disposed: { label: "Disposed of", shape: "✕", className: "border-line text-muted" },
};

export function LaserStatusBadge({ status }: { status: LaserStatus }) {
  const look = LOOK[status];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2 py-0.5 text-sm ${look.className}`}>
      <span aria-hidden="true">{look.shape}</span>
      {look.label}
    </span>
  );
}
