import { getDb } from "@/db";
import { Refused } from "@/components/shell/refused";
import { listLabs } from "@/lib/server/people";
import { pageActor, refusal } from "@/lib/server/page-guard";
import { NewBenchForm } from "./new-bench-form";

export const metadata = { title: "New bench" };

export default async function NewBenchPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { bench: ["create"] });
  if (refused) return <Refused reason={refused} />;
  const labs = (await listLabs(getDb(), actor)).filter((l) => actor.labIds.includes(l.id));
  return (
    <div className="max-w-xl">
      <h1 className="mb-1 text-2xl font-semibold">New bench</h1>
      <p className="mb-6 text-muted">It starts empty; you place the laser and the optics in the editor.</p>
      {labs.length === 0 ? (
        <p className="rounded-lg border border-line p-4">You are not a member of any lab yet, so you cannot start a bench. Ask an administrator to add you to one.</p>
      ) : (
        <NewBenchForm labs={labs.map((l) => ({ id: l.id, name: l.name }))} />
      )}
    </div>
  );
}
