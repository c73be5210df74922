// The local mail catcher: an SMTP server on loopback (smtp-server) that keeps every message it
// receives (parsed with mailparser) under .data/mail and shows them on a small web page.
//   SMTP  127.0.0.1:$CATCHER_SMTP_PORT (default 2525)   web  http://127.0.0.1:$CATCHER_HTTP_PORT (default 1080)
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import http from "node:http";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

const smtpPort = Number(process.env.CATCHER_SMTP_PORT ?? 2525);
const httpPort = Number(process.env.CATCHER_HTTP_PORT ?? 1080);
const storeDir = process.env.CATCHER_DIR ?? path.resolve(import.meta.dirname, "../.data/mail");
mkdirSync(storeDir, { recursive: true });

// messageId: the Message-ID header as sent (the outbox row's own, lib/mail/worker.ts), "" when there was none.
type Caught = { id: string; receivedAt: string; from: string; to: string[]; subject: string; messageId: string; text: string; html: string };

function list(): Caught[] {
  return readdirSync(storeDir)
    .filter((f) => f.endsWith(".json"))
    .map((f) => JSON.parse(readFileSync(path.join(storeDir, f), "utf8")) as Caught)
    .sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
}

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  banner: "Benchwarden mail catcher",
  size: 10 * 1024 * 1024,
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const id = `${Date.now()}-${randomUUID().slice(0, 8)}`;
        const to = session.envelope.rcptTo.map((r) => r.address);
        const caught: Caught = {
          id,
          receivedAt: new Date().toISOString(),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
          to,
          subject: mail.subject ?? "",
          messageId: mail.messageId ?? "",
          text: mail.text ?? "",
          html: typeof mail.html === "string" ? mail.html : "",
        };
        writeFileSync(path.join(storeDir, `${id}.json`), JSON.stringify(caught));
        callback();
      })
      .catch((error: Error) => callback(error));
  },
});

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
const page = (title: string, body: string) =>
  `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title><style>
  body{font:16px system-ui,sans-serif;margin:2rem;background:#f4f6f5;color:#111}table{border-collapse:collapse;width:100%;background:#fff}
  td,th{border-bottom:1px solid #ccd;padding:.5rem;text-align:left}a{color:#0b5257}pre{white-space:pre-wrap;background:#fff;padding:1rem}
  iframe{width:100%;height:28rem;border:1px solid #ccd;background:#fff}</style></head><body>${body}</body></html>`;

const web = http.createServer((req, res) => {
  const url = new URL(req.url ?? "/", `http://127.0.0.1:${httpPort}`);
  if (url.pathname === "/api/messages" && req.method === "GET") {
    const to = url.searchParams.get("to")?.toLowerCase();
    const messages = list().filter((m) => !to || m.to.some((a) => a.toLowerCase() === to));
    res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify(messages));
    return;
  }
  if (url.pathname === "/api/messages" && req.method === "DELETE") {
    for (const f of readdirSync(storeDir)) rmSync(path.join(storeDir, f));
    res.writeHead(204).end();
    return;
  }
  const match = url.pathname.match(/^\/messages\/([\w-]+)$/);
  if (match) {
    const m = list().find((x) => x.id === match[1]);
    if (!m) return void res.writeHead(404, { "content-type": "text/html" }).end(page("Not found", "<p>No such message.</p>"));
    res.writeHead(200, { "content-type": "text/html; charset=utf-8" }).end(
      page(m.subject, `<p><a href="/">← all messages</a></p><h1>${esc(m.subject)}</h1><p>From ${esc(m.from)} to ${esc(m.to.join(", "))}, ${esc(m.receivedAt)}</p>
      <h2>HTML part</h2><iframe sandbox srcdoc="${esc(m.html)}"></iframe><h2>Text part</h2><pre>${esc(m.text)}</pre>`),
    );
    return;
  }
  const rows = list()
    .map((m) => `<tr><td>${esc(m.receivedAt)}</td><td>${esc(m.to.join(", "))}</td><td><a href="/messages/${m.id}">${esc(m.subject || "(no subject)")}</a></td></tr>`)
    .join("");
  res.writeHead(200, { "content-type": "text/html; charset=utf-8" }).end(
    page("Benchwarden mail catcher", `<h1>Mail caught on 127.0.0.1:${smtpPort}</h1><p>Nothing here leaves this machine.</p>
    <table><thead><tr><th>Received</th><th>To</th><th>Subject</th></tr></thead><tbody>${rows || '<tr><td colspan="3">No messages yet.</td></tr>'}</tbody></table>`),
  );
});

smtp.listen(smtpPort, "127.0.0.1", () => {
  web.listen(httpPort, "127.0.0.1", () => console.log(`[mail-catcher] SMTP 127.0.0.1:${smtpPort}, web http://127.0.0.1:${httpPort}`));
});

function stop() {
  web.close();
  smtp.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 2000).unref();
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
