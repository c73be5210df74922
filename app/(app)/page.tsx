import Link from "next/link";
import { getDb } from "@/db";
import { BenchTable, type BenchRow } from "@/components/benches/bench-table";
import { listBenches, listRevisionsInState } from "@/lib/server/benches";
import { listLabs, listPeople } from "@/lib/server/people";
import { pageActor } from "@/lib/server/page-guard";

export const metadata = { title: "Home" };

function Section({ title, testId, children }: { title: string; testId: string; children: React.ReactNode }) {
  return (
    <section className="mb-10" data-testid={testId}>
      <h2 className="mb-3 text-xl font-semibold">{title}</h2>
      {children}
    </section>
  );
}

export default async function HomePage() {
  const actor = await pageActor();
  const db = getDb();
  const has = (role: string) => actor.roles.includes(role as never);
  const sections: React.ReactNode[] = [];

  if (has("researcher")) {
    const mine = await listBenches(db, actor, { authoredByMe: true });
    const rows: BenchRow[] = mine.map((b) => ({ benchId: b.id, title: b.title, labName: b.labName, authorName: b.authorName, number: b.latestRevision, state: b.latestState, contentHash: b.latestHash, updatedAt: b.updatedAt }));
    sections.push(
      <Section key="r" title="My benches" testId="home-researcher">
        <BenchTable rows={rows} caption="My benches" empty="You have no benches yet." />
      </Section>,
    );
  }
  if (has("officer")) {
    const waiting = await listRevisionsInState(db, actor, "submitted");
    sections.push(
      <Section key="o" title="Waiting for your review" testId="home-officer">
        <BenchTable rows={waiting.map((w) => ({ ...w, state: "submitted", href: `/reviews/${w.revisionId}` }))} caption="Revisions waiting for review" empty="Nothing is waiting for review." />
      </Section>,
    );
  }
  if (has("technician")) {
    const approved = await listRevisionsInState(db, actor, "approved");
    sections.push(
      <Section key="t" title="Signed-off benches to build" testId="home-technician">
        <BenchTable rows={approved.map((a) => ({ ...a, state: "approved" }))} caption="Signed-off benches in your labs" empty="No signed-off bench in your labs yet." />
      </Section>,
    );
  }
  if (has("auditor")) {
    const approvals = await listRevisionsInState(db, actor, "approved");
    sections.push(
      <Section key="a" title="Sign-offs" testId="home-auditor">
        <p className="mb-3">
          <Link href="/desk" className="underline">Open the sign-off desk</Link> <span className="text-muted">— filter every sign-off, read each bench&apos;s trail, export CSV.</span>
        </p>
        <BenchTable rows={approvals.map((a) => ({ ...a, state: "approved", href: `/reviews/${a.revisionId}` }))} caption="Every signed-off revision" empty="No revision has been signed off yet." />
      </Section>,
    );
  }
  if (has("admin")) {
    const [people, labs] = await Promise.all([listPeople(db, actor), listLabs(db, actor)]);
    sections.push(
      <Section key="ad" title="People and labs" testId="home-admin">
        <div className="grid gap-4 sm:grid-cols-2">
          <Link href="/admin/people" className="rounded-xl border border-line bg-panel p-5 no-underline hover:bg-raised">
            <p className="text-3xl font-semibold text-text">{people.length}</p>
            <p className="text-muted">people with an account — invite, review roles</p>
          </Link>
          <Link href="/admin/labs" className="rounded-xl border border-line bg-panel p-5 no-underline hover:bg-raised">
            <p className="text-3xl font-semibold text-text">{labs.length}</p>
            <p className="text-muted">labs — add a lab, see its rooms</p>
          </Link>
        </div>
      </Section>,
    );
  }

  return (
    <div>
      <h1 className="mb-6 text-2xl font-semibold">Hello, {actor.name}</h1>
      {sections.length ? sections : <p className="text-muted">Your account has no role yet. Ask your administrator to give you one.</p>}
    </div>
  );
}
