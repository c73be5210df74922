import { getDb } from "@/db";
import { InviteForm } from "@/components/admin/invite-form";
import { Refused } from "@/components/shell/refused";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { listLabs, listPeople } from "@/lib/server/people";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "People" };

export default async function PeoplePage() {
  const actor = await pageActor();
  const refused = refusal(actor, { user: ["list"] });
  if (refused) return <Refused reason={refused} />;
  const [people, labs] = await Promise.all([listPeople(getDb(), actor), listLabs(getDb(), actor)]);
  return (
    <div className="flex flex-col gap-8">
      <div>
        <h1 className="mb-4 text-2xl font-semibold">People</h1>
        <div className="overflow-x-auto rounded-lg border border-line">
          <table className="w-full text-left">
            <thead className="bg-raised text-sm text-muted">
              <tr>
                <th className="px-3 py-2 font-medium">Name</th>
                <th className="px-3 py-2 font-medium">E-mail</th>
                <th className="px-3 py-2 font-medium">Roles</th>
                <th className="px-3 py-2 font-medium">Labs</th>
                <th className="px-3 py-2 font-medium">Account</th>
              </tr>
            </thead>
            <tbody>
              {people.map((p) => (
                <tr key={p.id} className="border-t border-line">
                  <td className="px-3 py-2">{p.name}</td>
                  <td className="px-3 py-2">{p.email}</td>
                  <td className="px-3 py-2">{p.roles.map((r) => ROLE_LABELS[r]).join(", ")}</td>
                  <td className="px-3 py-2">{p.labs.join(", ") || "—"}</td>
                  <td className="px-3 py-2">{p.active ? "Active" : "Deactivated"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
      <InviteForm labs={labs} />
    </div>
  );
}
