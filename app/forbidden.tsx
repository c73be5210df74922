import Link from "next/link";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { currentActor } from "@/lib/server/authorize";

// A page the signed-in person's roles do not open: HTTP 403 (pages call forbidden() through Refused), saying which roles they hold.
export default async function Forbidden() {
  const actor = await currentActor().catch(() => null);
  const roles = actor?.roles.map((r) => ROLE_LABELS[r] ?? r).join(", ");
  return (
    <main className="mx-auto max-w-xl p-8">
      <div role="alert" className="rounded-xl border border-danger bg-panel p-6">
        <h1 className="text-xl font-semibold">Not open to your role</h1>
        <p className="mt-2 text-muted">
          {roles ? `Your role (${roles}) does not open this page.` : "Your roles do not open this page."} If you need it, ask your administrator.
        </p>
      </div>
      <Link href="/" className="mt-4 inline-block">
        Back to your home page
      </Link>
    </main>
  );
}
