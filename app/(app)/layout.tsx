import { AppHeader } from "@/components/shell/app-header";
import { env } from "@/lib/env";
import { pageActor } from "@/lib/server/page-guard";

export const dynamic = "force-dynamic";

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const actor = await pageActor();
  return (
    <>
      <AppHeader name={actor.name} roles={actor.roles} mailCatcherUrl={env().MAIL_CATCHER_URL} />
      <main className="mx-auto max-w-6xl px-4 py-6">{children}</main>
    </>
  );
}
