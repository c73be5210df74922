// Liveness for scripts and load balancers: answers without touching the database or a session.
export const dynamic = "force-dynamic";

export function GET() {
  return Response.json({ ok: true, service: "benchwarden" });
}
