import { getDb } from "@/db";
import { LabForm } from "@/components/admin/lab-form";
import { Refused } from "@/components/shell/refused";
import { listLabs } from "@/lib/server/people";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Labs" };

export default async function LabsPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { lab: ["manage"] });
  if (refused) return <Refused reason={refused} />;
  const labs = await listLabs(getDb(), actor);
  return (
    <div className="flex flex-col gap-8">
      <div>
        <h1 className="mb-4 text-2xl font-semibold">Labs</h1>
        <ul className="grid gap-3 sm:grid-cols-2">
          {labs.map((l) => (
            <li key={l.id} className="rounded-xl border border-line bg-panel p-4">
              <p className="font-semibold">{l.name}</p>
              <p className="text-muted">{l.room ?? "No room recorded"}</p>
            </li>
          ))}
        </ul>
      </div>
      <LabForm />
    </div>
  );
}
