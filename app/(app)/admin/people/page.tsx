import { formatDate } from "@/lib/format";
import { getDb } from "@/db";
import { InviteForm } from "@/components/admin/invite-form";
import { PersonActions } from "@/components/admin/person-actions";
import { Refused } from "@/components/shell/refused";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { listAdminPeople, listPendingInvitations } from "@/lib/server/people";
import { listLabs } from "@/lib/server/people";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "People" };

export default async function PeoplePage() {
  const actor = await pageActor();
  const refused = refusal(actor, { user: ["list"] });
  if (refused) return <Refused reason={refused} />;
  const [people, labs, invitations] = await Promise.all([listAdminPeople(getDb(), actor), listLabs(getDb(), actor), listPendingInvitations(getDb(), actor)]);
  const labName = new Map(labs.map((l) => [l.id, l.name]));
  return (
    <div className="flex flex-col gap-8">
      <div>
        <h1 className="mb-1 text-2xl font-semibold">People</h1>
        <p className="mb-4 text-muted">A deactivated person cannot sign in; everything they drew, wrote and signed stays in the record under their name.</p>
        <div tabIndex={0} role="region" aria-label="Table; scrolls sideways on a narrow screen" className="overflow-x-auto rounded-lg border border-line">
          <table className="w-full text-left" data-testid="people-table">
            <thead className="bg-raised text-sm text-muted">
              <tr>
                <th className="px-3 py-2 font-medium">Name</th>
                <th className="px-3 py-2 font-medium">E-mail</th>
                <th className="px-3 py-2 font-medium">Roles</th>
                <th className="px-3 py-2 font-medium">Labs</th>
                <th className="px-3 py-2 font-medium">Account</th>
                <th className="px-3 py-2 font-medium">Change</th>
              </tr>
            </thead>
            <tbody>
              {people.map((p) => (
                <tr key={p.id} className="border-t border-line align-top">
                  <td className="px-3 py-2">{p.name}</td>
                  <td className="px-3 py-2 break-all">{p.email}</td>
                  <td className="px-3 py-2">{p.roles.map((r) => ROLE_LABELS[r]).join(", ") || "—"}</td>
                  <td className="px-3 py-2">{p.labIds.map((id) => labName.get(id)).filter(Boolean).join(", ") || "—"}</td>
                  <td className="px-3 py-2">
                    {p.active ? (
                      "Active"
                    ) : (
                      <span className="text-warn">
                        <span aria-hidden="true">⊘ </span>Deactivated
                      </span>
                    )}
                  </td>
                  <td className="px-3 py-2">
                    <PersonActions person={p} isSelf={p.id === actor.userId} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
      {invitations.length ? (
        <section aria-labelledby="pending-heading">
          <h2 id="pending-heading" className="mb-2 text-lg font-semibold">
            Invitations not yet accepted
          </h2>
          <ul className="flex flex-col gap-1">
            {invitations.map((i) => (
              <li key={i.id}>
                {i.name} · {i.email} · {i.roles.map((r) => ROLE_LABELS[r]).join(", ")} <span className="text-sm text-muted">(link works until {formatDate(i.expiresAt)})</span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <InviteForm labs={labs} />
    </div>
  );
}
