// Queue throughput, against a running production server and its database:
// - e-mails per second: 1 000 messages put in the outbox at once, sent by two mail workers
//   (scripts/mail-worker.ts, started here) over SMTP to the mail catcher; the time until the last is
//   marked sent, and the catcher's count of each (every message exactly once);
// - build sheets per minute: sheets of several signed-off revisions (A4 and Letter each) asked for at
//   once through the API, rendered by the app's sheet jobs; the time until the last is ready.
//
//   runQueueBench({ appUrl, databaseUrl, catcherUrl, env, cookie }) → [{ name, value, unit, target }]
import { randomUUID } from "node:crypto";
import pg from "pg";
import { signedOffRevision } from "./bench-sheet";
import { TSX } from "./lib/provision";
import { startChild, waitForHttp } from "./lib/system";

type Figure = { name: string; value: number; unit: string; target: string };

const MESSAGES = 1000;
const WORKERS = 2;
const REVISIONS = 4;
const PAPERS = ["A4", "Letter"] as const;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function mailFigures(databaseUrl: string, catcherUrl: string, env: NodeJS.ProcessEnv): Promise<Figure[]> {
  startChild("mail catcher", TSX, ["scripts/mail-catcher.ts"], { env, stdio: ["ignore", "ignore", "inherit"] });
  await waitForHttp(`${catcherUrl}/api/messages`, 120_000);
  // The workers poll every 200 ms (the product's default is 2 s) and take 20 messages per round.
  for (let i = 0; i < WORKERS; i++) startChild(`mail worker ${i + 1}`, TSX, ["scripts/mail-worker.ts"], { env: { ...env, MAIL_WORKER_INTERVAL_MS: "200" }, stdio: ["ignore", "ignore", "inherit"] });
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  try {
    await sleep(3000); // the workers start (tsx compiles them)
    const subject = `Queue benchmark ${randomUUID().slice(0, 8)}`;
    const started = performance.now();
    await pool.query(
      `insert into mail_outbox (to_address, subject, text_body, html_body)
       select 'queue-' || n || '@northmere.example.edu', $1, 'queue benchmark', '<p>queue benchmark</p>' from generate_series(1, $2::int) as n`,
      [subject, MESSAGES],
    );
    const deadline = Date.now() + 600_000;
    for (;;) {
      const { rows } = await pool.query("select count(*)::int as n from mail_outbox where subject = $1 and state = 'sent'", [subject]);
      if (rows[0].n === MESSAGES) break;
      if (Date.now() > deadline) throw new Error(`The queue benchmark sent only ${rows[0].n} of ${MESSAGES} e-mails in 10 minutes.`);
      await sleep(100);
    }
    const seconds = (performance.now() - started) / 1000;
    const caught = (await (await fetch(`${catcherUrl}/api/messages`)).json()) as { to: string[]; subject: string }[];
    const perAddress = new Map<string, number>();
    for (const m of caught) if (m.subject === subject) for (const to of m.to) perAddress.set(to, (perAddress.get(to) ?? 0) + 1);
    const once = [...perAddress.values()].filter((n) => n === 1).length;
    const twice = [...perAddress.values()].filter((n) => n > 1).length;
    if (once !== MESSAGES || twice !== 0) throw new Error(`The queue benchmark's catcher holds ${once} messages once and ${twice} more than once, of ${MESSAGES}.`);
    return [
      { name: `e-mail: ${MESSAGES} messages through ${WORKERS} workers to the catcher (SMTP), time to the last sent`, value: seconds, unit: "s", target: "reference" },
      { name: `e-mail throughput, ${WORKERS} workers`, value: MESSAGES / seconds, unit: "e-mails/s", target: "reference" },
      { name: `e-mail: messages the catcher received exactly once (of ${MESSAGES})`, value: once, unit: "", target: `${MESSAGES}` },
    ];
  } finally {
    await pool.end();
  }
}

async function sheetFigures(appUrl: string, cookie: string): Promise<Figure[]> {
  const revisions: string[] = [];
  for (let i = 0; i < REVISIONS; i++) revisions.push((await signedOffRevision(appUrl, cookie)).revisionId);
  const call = async (method: string, path: string, body?: unknown) => {
    const res = await fetch(`${appUrl}${path}`, {
      method,
      headers: { origin: appUrl, cookie, ...(body === undefined ? {} : { "content-type": "application/json" }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    return { status: res.status, json: (await res.json().catch(() => null)) as { sheet?: { state: string } } | null };
  };
  const started = performance.now();
  const jobs = revisions.flatMap((id) => PAPERS.map((paper) => ({ id, paper })));
  for (const j of jobs) {
    const res = await call("POST", `/api/revisions/${j.id}/sheet`, { paper: j.paper });
    if (res.status !== 202 && res.status !== 200) throw new Error(`The sheet queue benchmark could not ask for a sheet: ${res.status} ${JSON.stringify(res.json)}`);
  }
  const deadline = Date.now() + 600_000;
  const pending = new Set(jobs.map((j) => `${j.id}|${j.paper}`));
  while (pending.size) {
    for (const key of [...pending]) {
      const [id, paper] = key.split("|");
      const res = await call("GET", `/api/revisions/${id}/sheet?paper=${paper}`);
      const state = res.json?.sheet?.state;
      if (state === "ready") pending.delete(key);
      else if (state === "failed") throw new Error(`The sheet queue benchmark's sheet ${key} failed.`);
    }
    if (Date.now() > deadline) throw new Error(`The sheet queue benchmark still waits for ${pending.size} sheets after 10 minutes.`);
    await sleep(200);
  }
  const minutes = (performance.now() - started) / 60_000;
  return [
    { name: `build sheets: ${jobs.length} asked for at once (${REVISIONS} revisions × A4 and Letter), time to the last ready`, value: minutes * 60, unit: "s", target: "reference" },
    { name: "build sheet throughput, one app server", value: jobs.length / minutes, unit: "sheets/min", target: "reference" },
  ];
}

export async function runQueueBench(options: { appUrl: string; databaseUrl: string; catcherUrl: string; env: NodeJS.ProcessEnv; cookie: string }): Promise<Figure[]> {
  return [...(await mailFigures(options.databaseUrl, options.catcherUrl, options.env)), ...(await sheetFigures(options.appUrl, options.cookie))];
}
