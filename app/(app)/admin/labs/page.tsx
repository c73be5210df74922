import { getDb } from "@/db";
import { LabForm } from "@/components/admin/lab-form";
import { LabMembers } from "@/components/admin/lab-members";
import { StandardPicker } from "@/components/eyewear/standard-picker";
import { Refused } from "@/components/shell/refused";
import { rolesAllow } from "@/lib/auth/permissions";
import { listAdminPeople, listLabsWithMembers } from "@/lib/server/people";
import { labStandards } from "@/lib/server/eyewear";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Labs" };

export default async function LabsPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { lab: ["manage"] });
  if (refused) return <Refused reason={refused} />;
  const [labs, people] = await Promise.all([listLabsWithMembers(getDb(), actor), rolesAllow(actor.roles, { user: ["list"] }) ? listAdminPeople(getDb(), actor) : Promise.resolve([])]);
  const standards = rolesAllow(actor.roles, { standard: ["set"] }) ? await labStandards(getDb(), actor) : null;
  const choosable = people.filter((p) => p.active).map((p) => ({ id: p.id, name: p.name }));
  return (
    <div className="flex flex-col gap-8">
      <div>
        <h1 className="mb-1 text-2xl font-semibold">Labs</h1>
        <p className="mb-4 text-muted">Researchers and technicians see the benches and lasers of the labs they belong to; officers and auditors see every lab.</p>
        <ul className="grid gap-3 sm:grid-cols-2">
          {labs.map((l) => (
            <li key={l.id} className="flex flex-col gap-3 rounded-xl border border-line bg-panel p-4" data-testid="lab-card">
              <div>
                <p className="font-semibold">{l.name}</p>
                <p className="text-muted">{l.room ?? "No room recorded"}</p>
              </div>
              {standards ? <StandardPicker labId={l.id} labName={l.name} current={standards.get(l.id) ?? "ANSI Z136.1-2014"} /> : null}
              <LabMembers labId={l.id} labName={l.name} members={l.members} people={choosable} />
            </li>
          ))}
        </ul>
      </div>
      <LabForm />
    </div>
  );
}
