import { getDb } from "@/db";
import { EyewearForm } from "@/components/eyewear/eyewear-form";
import { EyewearItemRow } from "@/components/eyewear/eyewear-item-row";
import { StandardPicker } from "@/components/eyewear/standard-picker";
import { Refused } from "@/components/shell/refused";
import { rolesAllow } from "@/lib/auth/permissions";
import { EN207_NOTE } from "@/lib/safety/eyewear";
import { eyewearShelves } from "@/lib/server/eyewear";
import { pageActor, refusal } from "@/lib/server/page-guard";

export const metadata = { title: "Eyewear" };

export default async function EyewearPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { eyewear: ["read"] });
  if (refused) return <Refused reason={refused} />;
  const shelves = await eyewearShelves(getDb(), actor);
  const mayManage = rolesAllow(actor.roles, { eyewear: ["manage"] });
  const mayPickStandard = rolesAllow(actor.roles, { standard: ["set"] });
  return (
    <div className="flex flex-col gap-8">
      <div>
        <h1 className="text-2xl font-semibold">Eyewear</h1>
        <p className="text-muted">
          {actor.allLabs ? "Every lab's laser protective eyewear." : "The laser protective eyewear your labs keep."} Each bench says, per emission line, whether an item here gives the OD needed.
          {mayManage ? " Safety officers keep these lists; every change is recorded in the audit trail." : ""}
        </p>
        <p className="mt-1 text-sm text-muted">{EN207_NOTE}</p>
      </div>
      {shelves.length === 0 ? <p className="text-muted">You are not a member of any lab yet.</p> : null}
      {shelves.map((shelf) => (
        <section key={shelf.labId} aria-labelledby={`lab-${shelf.labId}`} className="flex flex-col gap-3" data-testid="eyewear-lab">
          <h2 id={`lab-${shelf.labId}`} className="text-xl font-semibold">
            {shelf.labName}
          </h2>
          {mayPickStandard ? (
            <StandardPicker labId={shelf.labId} labName={shelf.labName} current={shelf.standard} />
          ) : (
            <p className="text-sm">
              <span className="font-medium">Safety standard: </span>
              {shelf.standard}
            </p>
          )}
          {shelf.items.length === 0 ? (
            <p className="text-muted">No eyewear on this lab&apos;s list yet.</p>
          ) : (
            <ul className="flex flex-col gap-2">
              {shelf.items.map((item) => (
                <EyewearItemRow key={item.id} item={item} mayManage={mayManage} />
              ))}
            </ul>
          )}
          {mayManage ? (
            <details className="rounded-lg border border-line p-3">
              <summary className="cursor-pointer font-medium">Add eyewear to {shelf.labName}</summary>
              <div className="mt-3">
                <EyewearForm labId={shelf.labId} />
              </div>
            </details>
          ) : null}
        </section>
      ))}
    </div>
  );
}
