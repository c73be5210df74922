import { getDb } from "@/db";
import { LaserForm } from "@/components/register/laser-form";
import { Refused } from "@/components/shell/refused";
import { listLabs } from "@/lib/server/people";
import { pageActor, refusal } from "@/lib/server/page-guard";
import { listResponsibleCandidates } from "@/lib/server/register";

export const metadata = { title: "Register a laser" };

export default async function NewLaserPage() {
  const actor = await pageActor();
  const refused = refusal(actor, { register: ["manage"] });
  if (refused) return <Refused reason={refused} />;
  const [labs, people] = await Promise.all([listLabs(getDb(), actor), listResponsibleCandidates(getDb(), actor)]);
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Register a laser</h1>
      <p className="text-muted">Enter the figures as the datasheet gives them: 1/e² beam diameter at the exit and 1/e² full-angle divergence.</p>
      <LaserForm labs={labs} people={people} />
    </div>
  );
}
