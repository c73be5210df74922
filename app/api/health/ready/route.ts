// Readiness for a proxy or an operator: is the database answering, how many e-mails wait in the
// outbox and for how long. 503 when the database does not answer within 2 s. No session needed;
// it reveals counts only. (/api/health stays the database-free liveness check.)
import { getDb } from "@/db";
import { outboxHealth } from "@/lib/mail/worker";

export const dynamic = "force-dynamic";

const TIMEOUT_MS = 2000;

export async function GET() {
  try {
    const outbox = await Promise.race([
      outboxHealth(getDb()),
      new Promise<never>((_, reject) => setTimeout(() => reject(new Error("the database did not answer within 2 s")), TIMEOUT_MS)),
    ]);
    return Response.json({ ok: true, database: "up", outbox });
  } catch (error) {
    console.error(`[health] not ready: ${error instanceof Error ? error.message : String(error)}`);
    return Response.json({ ok: false, database: "down", outbox: null }, { status: 503 });
  }
}
