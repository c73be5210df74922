// Scale data for the auditor's desk benchmark: 10 000 benches and 100 000 trail rows (revisions,
// decisions, comments, audit events) spread over labs, officers, classes, states and four years.
// Invented data (Northmere University, Department of Applied Optics). Batched INSERT … SELECT unnest(…).
//
//   DATABASE_URL=postgres://… npx tsx scripts/seed-scale.ts [--benches 10000] [--trail 100000]
import { createHash, randomUUID } from "node:crypto";
import pg from "pg";
import { seededRandom } from "@/lib/seeded-random";

export type ScaleCounts = { labs: number; people: number; benches: number; revisions: number; decisions: number; approvals: number; comments: number; auditEvents: number; trailRows: number; builds: number; mismatchedObservations: number };

const LAB_NAMES = [
  "Ultrafast Spectroscopy Lab",
  "Quantum Optics Lab",
  "Adaptive Optics Lab",
  "Fibre Sensing Lab",
  "Nonlinear Optics Lab",
  "Holography Teaching Lab",
  "Optical Metrology Lab",
  "Biophotonics Lab",
  "Laser Cooling Lab",
  "Terahertz Lab",
  "Photonic Chips Lab",
  "Atmospheric Lidar Lab",
];
const FIRST = ["Ada", "Bram", "Cleo", "Dov", "Elin", "Fenn", "Greta", "Hal", "Ines", "Joss", "Kira", "Lio", "Mara", "Nils", "Orla", "Pim", "Quin", "Rhea", "Sol", "Tove"];
const LAST = ["Ashgrove", "Bellweather", "Corran", "Dunlin", "Eskdale", "Fairlie", "Glenholm", "Harrowby", "Innes", "Jessop", "Kettering", "Lowther", "Marchbank", "Northey", "Ormsby"];
const THINGS = ["interferometer arm", "beam expander", "spatial filter", "iris zone test", "fibre coupling", "Fourier plane", "autocorrelator", "pump line", "probe path", "knife-edge profile", "alignment path", "double slit", "Michelson", "Mach–Zehnder", "telescope relay"];
const SOURCES = [
  { nm: 632.8, mw: 1, d: 0.8, cls: "2" },
  { nm: 632.8, mw: 4, d: 0.8, cls: "3R" },
  { nm: 532, mw: 20, d: 1.0, cls: "3B" },
  { nm: 405, mw: 4.5, d: 1.2, cls: "3R" },
  { nm: 780, mw: 0.3, d: 2.0, cls: "1" },
  { nm: 1064, mw: 2000, d: 2.5, cls: "4" },
  { nm: 650, mw: 0.9, d: 3.0, cls: "2" },
  { nm: 1550, mw: 8, d: 0.5, cls: "1M" },
];
const COMMENT_BODIES = [
  "Please add a beam block behind the screen.",
  "Is the iris centred on the beam? Give the tolerance.",
  "Eyewear for 532 nm is in the cabinet by the door.",
  "Lower the beam height below seated eye level.",
  "Done — block added at the end of the rail.",
  "The ND filter needs a holder, not tape.",
];

const DAY_MS = 86_400_000;

type Columns = Record<string, { type: string; values: unknown[] }>;

/** INSERT … SELECT * FROM unnest($1::t1[], $2::t2[], …) in chunks. */
async function insertColumns(client: pg.PoolClient, table: string, cols: Columns, chunk = 5000) {
  const names = Object.keys(cols);
  const n = cols[names[0]].values.length;
  for (let start = 0; start < n; start += chunk) {
    const params = names.map((k) => cols[k].values.slice(start, start + chunk));
    const casts = names.map((k, i) => `$${i + 1}::${cols[k].type}[]`).join(", ");
    await client.query(`insert into "${table}" (${names.map((k) => `"${k}"`).join(", ")}) select * from unnest(${casts})`, params);
  }
}

export async function seedScale(databaseUrl: string, options: { benches?: number; trailRows?: number; seed?: number; now?: Date } = {}): Promise<ScaleCounts> {
  const benchCount = options.benches ?? 10_000;
  const trailTarget = options.trailRows ?? 100_000;
  const random = seededRandom(options.seed ?? 20260);
  const pick = <T>(list: readonly T[]) => list[Math.floor(random() * list.length)];
  const now = options.now ?? new Date();
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 1 });
  pool.on("error", () => undefined);
  const client = await pool.connect();
  try {
    await client.query("begin");
    // Labs and people (no passwords: these accounts only carry history).
    const labs = LAB_NAMES.map((name, i) => ({ id: randomUUID(), name: `${name} (scale)`, room: `Harbour Building ${String.fromCharCode(65 + (i % 4))}${100 + i}` }));
    await insertColumns(client, "lab", { id: { type: "uuid", values: labs.map((l) => l.id) }, name: { type: "text", values: labs.map((l) => l.name) }, room: { type: "text", values: labs.map((l) => l.room) } });
    const people: { id: string; name: string; email: string; role: string }[] = [];
    for (let i = 0; i < 80; i++) {
      const name = `${FIRST[i % FIRST.length]} ${LAST[(i * 7) % LAST.length]}`;
      people.push({ id: randomUUID(), name, email: `scale-researcher-${i}@northmere.example.edu`, role: "researcher" });
    }
    const officers = Array.from({ length: 7 }, (_, i) => ({ id: randomUUID(), name: `${FIRST[(i * 3 + 5) % FIRST.length]} ${LAST[(i * 5 + 2) % LAST.length]} (LSO)`, email: `scale-officer-${i}@northmere.example.edu`, role: "officer" }));
    people.push(...officers);
    await insertColumns(client, "user", {
      id: { type: "text", values: people.map((p) => p.id) },
      name: { type: "text", values: people.map((p) => p.name) },
      email: { type: "text", values: people.map((p) => `${p.email.split("@")[0]}-${p.id.slice(0, 6)}@northmere.example.edu`) },
      email_verified: { type: "boolean", values: people.map(() => true) },
      role: { type: "text", values: people.map((p) => p.role) },
    });
    const researchers = people.filter((p) => p.role === "researcher");
    const membership = researchers.map((r, i) => ({ labId: labs[i % labs.length].id, userId: r.id }));
    await insertColumns(client, "lab_member", { lab_id: { type: "uuid", values: membership.map((m) => m.labId) }, user_id: { type: "text", values: membership.map((m) => m.userId) } });

    // Benches, revisions, decisions and comments.
    const B = { id: [] as string[], lab: [] as string[], title: [] as string[], author: [] as string[], at: [] as Date[] };
    const R = { id: [] as string[], bench: [] as string[], number: [] as number[], doc: [] as string[], hash: [] as string[], state: [] as string[], by: [] as string[], at: [] as Date[] };
    const D = { id: [] as string[], revision: [] as string[], bench: [] as string[], outcome: [] as string[], signer: [] as string[], signerName: [] as string[], meaning: [] as string[], conditions: [] as (string | null)[], reason: [] as (string | null)[], validUntil: [] as (Date | null)[], hash: [] as string[], summary: [] as string[], at: [] as Date[] };
    const C = { id: [] as string[], revision: [] as string[], bench: [] as string[], author: [] as string[], authorName: [] as string[], role: [] as string[], body: [] as string[], at: [] as Date[] };
    const A = { bench: [] as string[], revision: [] as (string | null)[], hash: [] as (string | null)[], actor: [] as string[], role: [] as string[], action: [] as string[], detail: [] as string[], at: [] as Date[] };
    const MEANING: Record<string, string> = {
      approved: "Approved for operation as drawn, with the conditions listed.",
      "changes-requested": "Not approved: changes are asked for before this bench may be operated.",
      rejected: "Not approved: this bench must not be operated as drawn.",
    };

    for (let b = 0; b < benchCount; b++) {
      const benchId = randomUUID();
      const labIndex = Math.floor(Math.pow(random(), 1.4) * labs.length); // some labs are busier
      const labMembers = membership.filter((m) => m.labId === labs[labIndex].id);
      const authorId = pick(labMembers).userId;
      const author = researchers.find((r) => r.id === authorId)!;
      const started = new Date(now.getTime() - (20 + random() * 4 * 365) * DAY_MS);
      const source = pick(SOURCES);
      B.id.push(benchId);
      B.lab.push(labs[labIndex].id);
      B.title.push(`${pick(THINGS)} ${source.nm} nm #${b + 1}`);
      B.author.push(author.id);
      B.at.push(started);
      A.bench.push(benchId); A.revision.push(null); A.hash.push(null); A.actor.push(author.id); A.role.push("researcher"); A.action.push("bench-created"); A.detail.push("{}"); A.at.push(started);

      const revisions = 1 + Math.floor(Math.pow(random(), 1.6) * 4);
      let t = started.getTime();
      let lastApprovedIndex = -1;
      const benchDecisions: { idx: number; outcome: string }[] = [];
      for (let n = 1; n <= revisions; n++) {
        const revId = randomUUID();
        const doc = {
          version: 1,
          title: B.title[b],
          elements: [
            { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: source.nm, powerMw: source.mw, beamDiameterMm: source.d },
            { id: "iris-1", kind: "aperture", positionMm: 300 + n * 10, diameterMm: 1 + (n % 3) },
            { id: "screen-1", kind: "screen", positionMm: 1400 },
          ],
        };
        const docText = JSON.stringify(doc);
        const hash = createHash("sha256").update(docText).digest("hex");
        const last = n === revisions;
        // The newest revision may still be in draft or waiting; earlier ones were all decided.
        const roll = random();
        const outcome = last ? (roll < 0.1 ? "draft" : roll < 0.18 ? "submitted" : roll < 0.85 ? "approved" : roll < 0.95 ? "changes-requested" : "rejected") : roll < 0.55 ? "approved" : roll < 0.9 ? "changes-requested" : "rejected";
        R.id.push(revId); R.bench.push(benchId); R.number.push(n); R.doc.push(docText); R.hash.push(hash); R.state.push(outcome); R.by.push(author.id); R.at.push(new Date(t));
        const saves = random() < 0.4 ? 1 : 0;
        for (let s = 0; s < saves; s++) {
          A.bench.push(benchId); A.revision.push(revId); A.hash.push(hash); A.actor.push(author.id); A.role.push("researcher"); A.action.push("draft-saved"); A.detail.push(`{"number":${n}}`); A.at.push(new Date(t + (s + 1) * 60_000));
        }
        if (outcome !== "draft") {
          const sentAt = t + DAY_MS * (0.2 + random());
          A.bench.push(benchId); A.revision.push(revId); A.hash.push(hash); A.actor.push(author.id); A.role.push("researcher"); A.action.push("review-submitted"); A.detail.push(`{"from":"draft","to":"submitted","number":${n}}`); A.at.push(new Date(sentAt));
          if (outcome !== "submitted") {
            const officer = pick(officers);
            const decidedAt = new Date(sentAt + DAY_MS * (0.5 + random() * 9));
            const months = pick([12, 12, 12, 6, 24]);
            const validUntil = outcome === "approved" ? new Date(decidedAt.getTime() + months * 30.4 * DAY_MS) : null;
            const cls = source.cls;
            D.id.push(randomUUID()); D.revision.push(revId); D.bench.push(benchId); D.outcome.push(outcome); D.signer.push(officer.id); D.signerName.push(officer.name); D.meaning.push(MEANING[outcome]);
            D.conditions.push(outcome === "approved" && random() < 0.6 ? pick(["Eyewear OD 3 at the laser wavelength for everyone in the room.", "Beam enclosure closed during use.", "Door interlock on; sign lit.", "Alignment at under 1 mW only."]) : null);
            D.reason.push(outcome === "approved" ? null : pick(COMMENT_BODIES));
            D.validUntil.push(validUntil); D.hash.push(hash); D.summary.push(JSON.stringify({ engine: "scale seed", hazardClass: { value: cls, source: "IEC 60825-1:2014 Tables 3–8" }, laser: { wavelengthNm: source.nm, powerMw: source.mw } })); D.at.push(decidedAt);
            benchDecisions.push({ idx: D.id.length - 1, outcome });
            if (outcome === "approved") lastApprovedIndex = R.id.length - 1;
            A.bench.push(benchId); A.revision.push(revId); A.hash.push(hash); A.actor.push(officer.id); A.role.push("officer"); A.action.push(`review-${outcome}`); A.detail.push(`{"from":"submitted","to":"${outcome}","number":${n}}`); A.at.push(decidedAt);
            const comments = outcome === "approved" ? (random() < 0.3 ? 1 : 0) : 1 + Math.floor(random() * 2);
            for (let c = 0; c < comments; c++) {
              const id = randomUUID();
              const fromOfficer = c % 2 === 0;
              C.id.push(id); C.revision.push(revId); C.bench.push(benchId); C.author.push(fromOfficer ? officer.id : author.id); C.authorName.push(fromOfficer ? officer.name : author.name); C.role.push(fromOfficer ? "Laser safety officer" : "Researcher"); C.body.push(pick(COMMENT_BODIES)); C.at.push(new Date(decidedAt.getTime() - 3600_000 + c * 600_000));
            }
            t = decidedAt.getTime();
          } else t = sentAt;
        }
        t += DAY_MS * (1 + random() * 20);
      }
      // Sign-offs replaced by a newer one become superseded; ended ones expired.
      for (const d of benchDecisions) {
        if (d.outcome !== "approved") continue;
        const revIndex = R.id.indexOf(D.revision[d.idx], R.id.length - revisions);
        if (revIndex !== lastApprovedIndex) R.state[revIndex] = "superseded";
        else if ((D.validUntil[d.idx] as Date).getTime() < now.getTime()) R.state[revIndex] = "expired";
      }
      B.at[b] = started;
    }

    // Fill the trail to the target with the technicians' and viewers' events on signed-off revisions.
    const base = R.id.length + D.id.length + C.id.length;
    const approvedRevisions = R.id.map((id, i) => ({ id, i })).filter((r) => R.state[r.i] !== "draft" && R.state[r.i] !== "submitted");
    const actions = ["build-sheet-requested", "build-sheet-exported", "build-started", "build-check-recorded", "build-observation-recorded", "sheet-verified"];
    while (base + A.bench.length < trailTarget && approvedRevisions.length) {
      const r = pick(approvedRevisions);
      A.bench.push(R.bench[r.i]); A.revision.push(r.id); A.hash.push(R.hash[r.i]); A.actor.push(pick(researchers).id); A.role.push("technician"); A.action.push(pick(actions)); A.detail.push("{}"); A.at.push(new Date(R.at[r.i].getTime() + DAY_MS * (5 + random() * 30)));
    }

    // Builds of about a third of the sign-offs, one to three observations each, about one in ten differing from the
    // prediction (the desk flags those and filters to them). Drawn after everything above, so the rest stays as before.
    const K = { id: [] as string[], revision: [] as string[], bench: [] as string[], hash: [] as string[], by: [] as string[], at: [] as Date[] };
    const O = { build: [] as string[], mismatch: [] as boolean[], reasons: [] as string[], by: [] as string[], at: [] as Date[] };
    for (let d = 0; d < D.id.length; d++) {
      if (D.outcome[d] !== "approved" || random() >= 0.33) continue;
      const id = randomUUID();
      const technician = pick(researchers).id;
      const at = new Date(D.at[d].getTime() + DAY_MS * (2 + random() * 30));
      K.id.push(id); K.revision.push(D.revision[d]); K.bench.push(D.bench[d]); K.hash.push(D.hash[d]); K.by.push(technician); K.at.push(at);
      const observations = 1 + Math.floor(random() * 3);
      for (let o = 0; o < observations; o++) {
        const mismatch = random() < 0.1;
        O.build.push(id); O.mismatch.push(mismatch); O.reasons.push(JSON.stringify(mismatch ? ["Centre: predicted bright, seen dark."] : [])); O.by.push(technician); O.at.push(new Date(at.getTime() + (o + 1) * 3600_000));
      }
    }

    await insertColumns(client, "bench", { id: { type: "uuid", values: B.id }, lab_id: { type: "uuid", values: B.lab }, title: { type: "text", values: B.title }, author_id: { type: "text", values: B.author }, created_at: { type: "timestamptz", values: B.at }, updated_at: { type: "timestamptz", values: B.at } });
    await insertColumns(
      client,
      "bench_revision",
      {
        id: { type: "uuid", values: R.id },
        bench_id: { type: "uuid", values: R.bench },
        number: { type: "int", values: R.number },
        document: { type: "jsonb", values: R.doc },
        content_hash: { type: "text", values: R.hash },
        state: { type: "text", values: R.state },
        created_by: { type: "text", values: R.by },
        created_at: { type: "timestamptz", values: R.at },
        updated_at: { type: "timestamptz", values: R.at },
      },
      2000,
    );
    await insertColumns(client, "review_decision", {
      id: { type: "uuid", values: D.id },
      revision_id: { type: "uuid", values: D.revision },
      bench_id: { type: "uuid", values: D.bench },
      outcome: { type: "text", values: D.outcome },
      signer_id: { type: "text", values: D.signer },
      signer_name: { type: "text", values: D.signerName },
      signer_role: { type: "text", values: D.signer.map(() => "Laser safety officer") },
      meaning: { type: "text", values: D.meaning },
      conditions: { type: "text", values: D.conditions },
      reason: { type: "text", values: D.reason },
      valid_until: { type: "timestamptz", values: D.validUntil },
      content_hash: { type: "text", values: D.hash },
      hazard_summary: { type: "jsonb", values: D.summary },
      step_up_verified: { type: "boolean", values: D.outcome.map((o) => o === "approved") },
      decided_at: { type: "timestamptz", values: D.at },
    });
    await insertColumns(client, "review_comment", {
      id: { type: "uuid", values: C.id },
      revision_id: { type: "uuid", values: C.revision },
      bench_id: { type: "uuid", values: C.bench },
      thread_id: { type: "uuid", values: C.id },
      author_id: { type: "text", values: C.author },
      author_name: { type: "text", values: C.authorName },
      author_role: { type: "text", values: C.role },
      body: { type: "text", values: C.body },
      created_at: { type: "timestamptz", values: C.at },
    });
    await insertColumns(client, "audit_event", {
      bench_id: { type: "uuid", values: A.bench },
      revision_id: { type: "uuid", values: A.revision },
      content_hash: { type: "text", values: A.hash },
      actor_id: { type: "text", values: A.actor },
      actor_role: { type: "text", values: A.role },
      action: { type: "text", values: A.action },
      detail: { type: "jsonb", values: A.detail },
      at: { type: "timestamptz", values: A.at },
    });
    await insertColumns(client, "build_record", {
      id: { type: "uuid", values: K.id },
      revision_id: { type: "uuid", values: K.revision },
      bench_id: { type: "uuid", values: K.bench },
      content_hash: { type: "text", values: K.hash },
      technician_id: { type: "text", values: K.by },
      state: { type: "text", values: K.id.map(() => "completed") },
      created_at: { type: "timestamptz", values: K.at },
      updated_at: { type: "timestamptz", values: K.at },
    });
    await insertColumns(client, "build_observation", {
      build_id: { type: "uuid", values: O.build },
      aperture_id: { type: "text", values: O.build.map(() => "iris-1") },
      centre_seen: { type: "text", values: O.mismatch.map((m) => (m ? "dark" : "bright")) },
      centre_predicted: { type: "text", values: O.build.map(() => "bright") },
      mismatch: { type: "boolean", values: O.mismatch },
      reasons: { type: "jsonb", values: O.reasons },
      recorded_by: { type: "text", values: O.by },
      created_at: { type: "timestamptz", values: O.at },
    });
    await client.query("commit");
    // As autovacuum would have by now: statistics and the visibility map (index-only scans rely on it).
    await client.query("vacuum analyze");
    return {
      labs: labs.length,
      people: people.length,
      benches: B.id.length,
      revisions: R.id.length,
      decisions: D.id.length,
      approvals: D.outcome.filter((o) => o === "approved").length,
      comments: C.id.length,
      auditEvents: A.bench.length,
      trailRows: R.id.length + D.id.length + C.id.length + A.bench.length,
      builds: K.id.length,
      mismatchedObservations: O.mismatch.filter(Boolean).length,
    };
  } catch (error) {
    await client.query("rollback").catch(() => undefined);
    throw error;
  } finally {
    client.release();
    await pool.end();
  }
}

const isMain = process.argv[1] && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isMain) {
  const arg = (name: string) => {
    const i = process.argv.indexOf(name);
    return i > 0 ? Number(process.argv[i + 1]) : undefined;
  };
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("Set DATABASE_URL to the database to fill (a scratch one: this adds 10 000 benches).");
    process.exit(1);
  }
  const started = Date.now();
  seedScale(url, { benches: arg("--benches"), trailRows: arg("--trail") })
    .then((counts) => console.log(JSON.stringify({ ...counts, seconds: (Date.now() - started) / 1000 })))
    .catch((error: unknown) => {
      console.error(error);
      process.exit(1);
    });
}
