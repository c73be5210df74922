// Attacks over plain HTTP: framing the sign-off page, posting from another site, text that breaks the
// database (NUL, lone surrogates), file names outside Latin-1, a 60 MB chunked body, and two
// simultaneous build starts. Every response carries the security headers.
import http from "node:http";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

let pool: pg.Pool;
const cookie = {} as Record<"researcher" | "officer" | "technician", string>;
let labId = "";
type Json = Record<string, unknown>;
const errorOf = (res: { json: Json | null }) => (res.json?.error ?? {}) as { code: string; message: string; fields: { path: string; message: string }[] };

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of ["researcher", "officer", "technician"] as const) cookie[key] = (await signIn(DEMO[key])).cookie;
  labId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
});

afterAll(async () => {
  await pool?.end();
});

async function approvedRevision(title: string) {
  const b = await createDrawnBench(pool, cookie.researcher, labId, sampleBench(title));
  expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
  const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
  expect(decided.status, decided.text).toBe(201);
  return b;
}

describe("security headers on every response", () => {
  function expectCommon(res: Response, what: string) {
    expect(res.headers.get("x-content-type-options"), what).toBe("nosniff");
    expect(res.headers.get("referrer-policy"), what).toBe("same-origin");
    expect(res.headers.get("permissions-policy"), what).toMatch(/camera=\(\)/);
  }

  it("pages: a per-request nonce on every script, no framing, no inline script without it", async () => {
    const nonces: string[] = [];
    for (const path of ["/sign-in", "/sign-in", "/no-such-page"]) {
      const res = await fetch(`${APP_URL}${path}`);
      expectCommon(res, path);
      const csp = res.headers.get("content-security-policy") ?? "";
      expect(csp).toMatch(/frame-ancestors 'none'/);
      expect(csp).toMatch(/object-src 'none'/);
      expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
      expect(csp).not.toMatch(/script-src[^;]*'unsafe-eval'/);
      const nonce = csp.match(/'nonce-([^']+)'/)?.[1];
      expect(nonce, path).toBeTruthy();
      nonces.push(nonce!);
      const html = await res.text();
      const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
      expect(scripts.length, path).toBeGreaterThan(0);
      for (const tag of scripts) expect(tag, path).toContain(`nonce="${nonce}"`);
    }
    expect(new Set(nonces).size).toBe(nonces.length);
  });

  it("the sign-off screen cannot be framed", async () => {
    const res = await fetch(`${APP_URL}/reviews`, { headers: { cookie: cookie.officer } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-security-policy")).toMatch(/frame-ancestors 'none'/);
    expect(res.headers.get("x-frame-options")).toBe("DENY");
  });

  it("API answers and static files", async () => {
    const api = await fetch(`${APP_URL}/api/health`);
    expectCommon(api, "api");
    expect(api.headers.get("content-security-policy")).toBe("default-src 'none'; frame-ancestors 'none'");
    const refused = await fetch(`${APP_URL}/api/benches`);
    expect(refused.status).toBe(401);
    expectCommon(refused, "401");
    const html = await (await fetch(`${APP_URL}/sign-in`)).text();
    const chunk = html.match(/src="(\/_next\/static\/[^"]+\.js)"/)![1];
    const js = await fetch(`${APP_URL}${chunk}`);
    expect(js.status).toBe(200);
    expectCommon(js, "static");
  });
});

describe("state-changing requests from another site", () => {
  const bench = () => ({ labId, title: `Cross-site ${Date.now()}` });

  it("are refused with a valid session cookie, whatever the route", async () => {
    for (const origin of ["https://evil.example", "null", "http://127.0.0.1:3101", "http://127.0.0.1.evil.example"]) {
      const res = await call("POST", "/api/benches", cookie.researcher, bench(), { origin });
      expect(res.status, origin).toBe(403);
      expect(errorOf(res).message).toMatch(/another site/);
    }
    const noOrigin = await fetch(`${APP_URL}/api/benches`, {
      method: "POST",
      headers: { cookie: cookie.researcher, "content-type": "application/json", "sec-fetch-site": "cross-site" },
      body: JSON.stringify(bench()),
    });
    expect(noOrigin.status).toBe(403);
    const { rows } = await pool.query("select 1 from bench where title like 'Cross-site %'");
    expect(rows.length).toBe(0);
    // The app's own page may.
    expect((await call("POST", "/api/benches", cookie.researcher, bench())).status).toBe(201);
  });

  it("the sign-in endpoint refuses another site too", async () => {
    const res = await call("POST", "/api/auth/sign-in/email", undefined, { email: DEMO.researcher, password: DEMO_PASSWORD }, { origin: "https://evil.example", "x-forwarded-for": "203.0.113.201" });
    expect(res.status).toBe(403);
  });

  it("reads from another site are not state changes and are left to the cookie's SameSite", async () => {
    expect((await call("GET", "/api/benches", cookie.researcher, undefined, { origin: "https://evil.example" })).status).toBe(200);
  });
});

describe("text that cannot be stored", () => {
  const NUL = "Bench\u0000one";
  const LONE = "Bench \ud800 two";

  it("a NUL or a lone surrogate in a text field is a 400 naming the field, on every kind of route", async () => {
    const cases: [string, string, Json, string][] = [
      ["POST", "/api/benches", { labId, title: NUL }, "title"],
      ["POST", "/api/benches", { labId, title: LONE }, "title"],
      ["POST", "/api/labs", { name: NUL }, "name"],
      ["POST", "/api/invitations", { email: "x@northmere.example.edu", name: LONE, roles: ["researcher"] }, "name"],
      ["POST", "/api/analyze", { version: 1, title: LONE, elements: [] }, "title"],
      ["POST", "/api/invitations/accept", { token: "abcdefghijkl\u0000", password: "long-enough-password" }, "token"],
      ["POST", "/api/lasers", { model: NUL }, "model"],
    ];
    const admin = (await signIn(DEMO.admin)).cookie;
    const officer = cookie.officer;
    for (const [method, path, body, field] of cases) {
      const who = path === "/api/labs" || path === "/api/invitations" ? admin : path.startsWith("/api/lasers") ? officer : cookie.researcher;
      const res = await call(method, path, who, body);
      expect(res.status, `${path} ${res.text.slice(0, 200)}`).toBe(400);
      expect(errorOf(res).fields.map((f) => f.path), path).toContain(field);
      expect(errorOf(res).fields.find((f) => f.path === field)!.message).toMatch(/NUL|surrogate/);
    }
  });

  it("nested fields (an element id inside a drawing, a comment) and query strings too", async () => {
    const created = await call("POST", "/api/benches", cookie.researcher, { labId, title: `Text checks ${Date.now()}` });
    const benchId = String(created.json!.id);
    const draft = await call("GET", `/api/benches/${benchId}/draft`, cookie.researcher);
    const d = draft.json!.draft as { revisionNumber: number; version: number };
    const doc = sampleBench("ok");
    doc.elements[2] = { ...doc.elements[2], id: "iris\u0000" } as never;
    const saved = await call("PUT", `/api/benches/${benchId}/draft`, cookie.researcher, { document: doc, baseRevision: d.revisionNumber, baseVersion: d.version });
    expect(saved.status, saved.text).toBe(400);
    expect(errorOf(saved).fields.map((f) => f.path)).toContain("document.elements.2.id");
    const desk = await call("GET", `/api/desk/approvals?q=${encodeURIComponent("a\u0000b")}`, cookie.officer);
    expect(desk.status).toBe(400);
    expect(errorOf(desk).fields.map((f) => f.path)).toContain("q");
  });

  it("the shared helper is what every schema uses", async () => {
    const { safeText } = await import("../../lib/validation/text");
    expect(safeText().safeParse("ok ✓ 光").success).toBe(true);
    expect(safeText().safeParse("a\u0000").success).toBe(false);
    expect(safeText().safeParse("\udc00a").success).toBe(false);
    expect(safeText().safeParse("😀").success).toBe(true);
  });
});

describe("uploads keep their names", () => {
  it("a name outside Latin-1 is stored as given and comes back with RFC 6266 filename*", async () => {
    const b = await approvedRevision(`Upload names ${Date.now()}`);
    const started = await call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId });
    expect(started.status, started.text).toBeLessThan(300);
    const buildId = (started.json!.build as { id: string }).id;
    const name = "Schirm – Ø 2 mm «光学» \"quoted\" 😀.png";
    const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64, 1)]);
    const form = new FormData();
    form.set("file", new Blob([new Uint8Array(png)], { type: "image/png" }), name);
    form.set("kind", "screen-photo");
    const up = await fetch(`${APP_URL}/api/builds/${buildId}/uploads`, { method: "POST", headers: { cookie: cookie.technician, origin: APP_URL }, body: form });
    expect(up.status).toBe(201);
    const kept = ((await up.json()) as { upload: { id: string; url: string; fileName: string } }).upload;
    const { rows } = await pool.query<{ file_name: string }>("select file_name from upload where id = $1", [kept.id]);
    expect(rows[0].file_name).toBe(name);
    const served = await fetch(`${APP_URL}${kept.url}`, { headers: { cookie: cookie.technician } });
    expect(served.status).toBe(200);
    const disposition = served.headers.get("content-disposition")!;
    const star = disposition.match(/filename\*=UTF-8''([^;]+)/)![1];
    expect(decodeURIComponent(star)).toBe(name);
    expect(disposition).toMatch(/^inline; filename="[\x20-\x7e]+"; /);
    expect(Buffer.compare(Buffer.from(await served.arrayBuffer()), png)).toBe(0);

    const broken = new FormData();
    broken.set("file", new Blob([new Uint8Array(png)], { type: "image/png" }), "screen\u0000.png");
    broken.set("kind", "screen-photo");
    const refused = await fetch(`${APP_URL}/api/builds/${buildId}/uploads`, { method: "POST", headers: { cookie: cookie.technician, origin: APP_URL }, body: broken });
    expect([201, 400]).toContain(refused.status); // the browser's form encoder may already drop the NUL
    if (refused.status === 400) expect(((await refused.json()) as { error: { fields: { path: string }[] } }).error.fields[0].path).toBe("file");
  });
});

/** Sends a chunked body of up to totalBytes; resolves when the server answers, with what was sent by then. */
function chunkedPost(path: string, totalBytes: number, headers: Record<string, string>): Promise<{ status: number; sentBytes: number; body: string }> {
  return new Promise((resolve, reject) => {
    const url = new URL(path, APP_URL);
    let sent = 0;
    let answered = false;
    const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: "POST", headers: { ...headers, "transfer-encoding": "chunked", origin: APP_URL } }, (res) => {
      answered = true;
      const at = sent;
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (c: string) => (body += c));
      res.on("end", () => {
        req.destroy();
        resolve({ status: res.statusCode ?? 0, sentBytes: at, body });
      });
    });
    req.on("error", (e) => (answered ? undefined : reject(e)));
    const chunk = Buffer.alloc(64 * 1024, 0x20);
    const pump = () => {
      while (!answered && sent < totalBytes) {
        sent += chunk.length;
        if (!req.write(chunk)) return void req.once("drain", pump);
      }
      if (!answered) req.end();
    };
    pump();
  });
}

describe("request bodies are limited while they stream", () => {
  it("a chunked 60 MB JSON body is stopped early with 413", async () => {
    const res = await chunkedPost("/api/benches", 60 * 1024 * 1024, { cookie: cookie.researcher, "content-type": "application/json" });
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body).error.code).toBe("payload-too-large");
    expect(res.sentBytes).toBeLessThan(20 * 1024 * 1024);
  });

  it("a chunked 60 MB upload is stopped early with 413", async () => {
    const b = await approvedRevision(`Chunked upload ${Date.now()}`);
    const started = await call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId });
    const buildId = (started.json!.build as { id: string }).id;
    const res = await chunkedPost(`/api/builds/${buildId}/uploads`, 60 * 1024 * 1024, { cookie: cookie.technician, "content-type": "multipart/form-data; boundary=x" });
    expect(res.status).toBe(413);
    expect(res.sentBytes).toBeLessThan(40 * 1024 * 1024);
  });
});

describe("one open build per revision and technician", () => {
  it("two simultaneous starts make one build", async () => {
    const b = await approvedRevision(`Simultaneous starts ${Date.now()}`);
    const results = await Promise.all([0, 1, 2, 3].map(() => call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId })));
    for (const r of results) expect([200, 201, 409], r.text).toContain(r.status);
    const ids = new Set(results.filter((r) => r.status < 300).map((r) => (r.json!.build as { id: string }).id));
    expect(ids.size).toBe(1);
    const { rows } = await pool.query("select id from build_record where revision_id = $1 and state = 'in-progress'", [b.revisionId]);
    expect(rows.length).toBe(1);
    const started = await pool.query("select 1 from audit_event where action = 'build-started' and revision_id = $1", [b.revisionId]);
    expect(started.rowCount).toBe(1);
  });
});
