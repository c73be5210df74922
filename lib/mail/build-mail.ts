// The as-built record's e-mails: an observation that does not match the prediction goes to the bench's
// author, naming the bench, revision, content hash, what was predicted and what was seen, with a link.
import { env } from "@/lib/env";
import { escapeHtml, type MailMessage } from "./templates";

export type MismatchMailInput = {
  to: { email: string; name: string };
  benchTitle: string;
  labName: string;
  revisionId: string;
  revisionNumber: number;
  contentHash: string;
  technicianName: string;
  /** The aperture the observation is about, or null for the screen as a whole. */
  apertureId: string | null;
  /** One sentence per quantity that differs, e.g. "Centre: predicted dark, seen bright." */
  reasons: string[];
  note: string | null;
};

export function observationMismatchMail(m: MismatchMailInput): MailMessage {
  const url = `${env().APP_URL.replace(/\/$/, "")}/reviews/${m.revisionId}`;
  const where = m.apertureId ? ` behind aperture ${m.apertureId}` : " on the screen";
  const intro = `${m.technicianName} rebuilt revision ${m.revisionNumber} of "${m.benchTitle}" and saw something${where} that does not match the prediction.`;
  const advice = "Check the drawing against the bench as built before the setup is used for work; a changed drawing makes a new revision that needs a new sign-off.";
  const facts: [string, string][] = [
    ["Bench", m.benchTitle],
    ["Lab", m.labName],
    ["Revision", String(m.revisionNumber)],
    ["Content hash (SHA-256)", m.contentHash],
    ["Observed by", m.technicianName],
  ];
  const text = [
    `Hello ${m.to.name},`,
    intro,
    ...m.reasons.map((r) => `- ${r}`),
    m.note ? `Technician's note:\n> ${m.note.split("\n").join("\n> ")}` : "",
    facts.map(([k, v]) => `${k}: ${v}`).join("\n"),
    advice,
    `Open the revision: ${url}`,
    "-- \nBenchwarden — laser bench planning and sign-off",
  ]
    .filter(Boolean)
    .join("\n\n");
  const html = `<!doctype html><html><body style="font-family:sans-serif;font-size:15px;color:#111;max-width:600px">
<h1 style="font-size:18px">An observation does not match the prediction</h1>
<p>Hello ${escapeHtml(m.to.name)},</p>
<p>${escapeHtml(intro)}</p>
<ul>${m.reasons.map((r) => `<li>${escapeHtml(r)}</li>`).join("")}</ul>
${m.note ? `<p style="margin:12px 0 4px;color:#555">Technician's note:</p><blockquote style="margin:0 0 12px;padding:8px 12px;border-left:3px solid #0f3d3e;white-space:pre-wrap">${escapeHtml(m.note)}</blockquote>` : ""}
<table style="border-collapse:collapse;margin:8px 0 12px">${facts
    .map(([k, v]) => `<tr><th align="left" style="padding:4px 12px 4px 0;font-weight:normal;color:#555">${escapeHtml(k)}</th><td style="padding:4px 0;${k.startsWith("Content hash") ? "font-family:monospace;font-size:12px;word-break:break-all" : ""}">${escapeHtml(v)}</td></tr>`)
    .join("")}</table>
<p>${escapeHtml(advice)}</p>
<p style="margin:16px 0"><a href="${escapeHtml(url)}" style="background:#0f3d3e;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Open the revision</a></p>
<p style="font-size:12px;color:#555">Or open: ${escapeHtml(url)}</p>
<p style="font-size:12px;color:#555">Benchwarden — laser bench planning and sign-off</p>
</body></html>`;
  return { to: m.to.email, subject: `Observation differs from the prediction: ${m.benchTitle}, revision ${m.revisionNumber}`, text, html };
}
