// The review workflow's e-mails: submitted, withdrawn, decided, expiry reminders, expired, new comment. Each
// has a text and an HTML part, names the bench, the revision and its content hash, and links to it.
import { env } from "@/lib/env";
import { formatDate as formatDay, formatDateTime } from "@/lib/format/date";
import { escapeHtml, type MailMessage } from "./templates";

export type RevisionMailContext = {
  benchTitle: string;
  labName: string;
  revisionId: string;
  revisionNumber: number;
  contentHash: string;
  authorName: string;
};

/** `builds`: a technician, whose link goes to where the build can be started. */
export type Recipient = { email: string; name: string; builds?: boolean };

/** The link to exactly this revision's review page. */
export function revisionUrl(revisionId: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/reviews/${revisionId}`;
}

/** The link to this revision on the technician's list, where its build is started and its sheet downloaded. */
export function buildListUrl(revisionId: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/builds#revision-${revisionId}`;
}

/** A day in the lab's time zone; validity runs to the end of that day. */
function formatDate(date: Date): string {
  return formatDay(date);
}

type Fact = [label: string, value: string];

function facts(ctx: RevisionMailContext, extra: Fact[] = []): Fact[] {
  return [
    ["Bench", ctx.benchTitle],
    ["Lab", ctx.labName],
    ["Revision", String(ctx.revisionNumber)],
    ["Content hash (SHA-256)", ctx.contentHash],
    ["Drawn by", ctx.authorName],
    ...extra,
  ];
}

function compose(input: { to: Recipient; subject: string; title: string; paragraphs: string[]; facts: Fact[]; quote?: { label: string; text: string }; linkLabel: string; url: string }): MailMessage {
  const factText = input.facts.map(([k, v]) => `${k}: ${v}`).join("\n");
  const quoteText = input.quote ? `\n${input.quote.label}:\n${input.quote.text.split("\n").map((l) => `> ${l}`).join("\n")}\n` : "";
  const text = `Hello ${input.to.name},\n\n${input.paragraphs.join("\n\n")}\n\n${factText}\n${quoteText}\n${input.linkLabel}: ${input.url}\n\n-- \nBenchwarden — laser bench planning and sign-off\n`;

  const rows = input.facts
    .map(
      ([k, v]) =>
        `<tr><th align="left" style="padding:4px 12px 4px 0;font-weight:normal;color:#555;vertical-align:top">${escapeHtml(k)}</th><td style="padding:4px 0;${k.startsWith("Content hash") ? "font-family:monospace;font-size:12px;word-break:break-all" : ""}">${escapeHtml(v)}</td></tr>`,
    )
    .join("");
  const quoteHtml = input.quote
    ? `<p style="margin:12px 0 4px;color:#555">${escapeHtml(input.quote.label)}:</p><blockquote style="margin:0 0 12px;padding:8px 12px;border-left:3px solid #0f3d3e;white-space:pre-wrap">${escapeHtml(input.quote.text)}</blockquote>`
    : "";
  const html = `<!doctype html><html><body style="font-family:sans-serif;font-size:15px;color:#111;max-width:600px">
<h1 style="font-size:18px">${escapeHtml(input.title)}</h1>
<p style="margin:0 0 12px">Hello ${escapeHtml(input.to.name)},</p>
${input.paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join("")}
<table style="border-collapse:collapse;margin:8px 0 12px">${rows}</table>
${quoteHtml}
<p style="margin:16px 0"><a href="${escapeHtml(input.url)}" style="background:#0f3d3e;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(input.linkLabel)}</a></p>
<p style="font-size:12px;color:#555">Or open: ${escapeHtml(input.url)}</p>
<p style="font-size:12px;color:#555">Benchwarden — laser bench planning and sign-off</p>
</body></html>`;
  return { to: input.to.email, subject: input.subject, text, html };
}

export function reviewSubmittedMail(to: Recipient, ctx: RevisionMailContext): MailMessage {
  return compose({
    to,
    subject: `Waiting for your review: ${ctx.benchTitle}, revision ${ctx.revisionNumber}`,
    title: "A bench is waiting for your review",
    paragraphs: [`${ctx.authorName} has sent revision ${ctx.revisionNumber} of "${ctx.benchTitle}" for laser safety review. The laser must stay off until it is signed off.`],
    facts: facts(ctx),
    linkLabel: "Open the review",
    url: revisionUrl(ctx.revisionId),
  });
}

export function reviewWithdrawnMail(to: Recipient, ctx: RevisionMailContext): MailMessage {
  return compose({
    to,
    subject: `No longer waiting for review: ${ctx.benchTitle}, revision ${ctx.revisionNumber}`,
    title: "A submission was withdrawn",
    paragraphs: [
      `${ctx.authorName} has withdrawn revision ${ctx.revisionNumber} of "${ctx.benchTitle}" from review. Nothing is waiting for your decision on it; a new submission will be announced in a new e-mail.`,
    ],
    facts: facts(ctx),
    linkLabel: "Open the revision",
    url: revisionUrl(ctx.revisionId),
  });
}

export type DecisionMailInput = {
  outcome: "approved" | "changes-requested" | "rejected";
  signerName: string;
  signerRole: string;
  decidedAt: Date;
  meaning: string;
  conditions?: string | null;
  reason?: string | null;
  validUntil?: Date | null;
  /** Numbers of earlier revisions whose sign-off this one replaces. */
  supersededNumbers?: number[];
};

const DECISION_WORDS: Record<DecisionMailInput["outcome"], { subject: string; title: string }> = {
  approved: { subject: "Signed off", title: "The bench is signed off" },
  "changes-requested": { subject: "Changes asked", title: "The safety officer asks for changes" },
  rejected: { subject: "Turned down", title: "The bench was turned down" },
};

export function reviewDecisionMail(to: Recipient, ctx: RevisionMailContext, d: DecisionMailInput): MailMessage {
  const words = DECISION_WORDS[d.outcome];
  const paragraphs = [`${d.signerName} (${d.signerRole}) decided on revision ${ctx.revisionNumber} of "${ctx.benchTitle}": ${d.meaning}`];
  if (d.outcome === "approved") {
    paragraphs.push(d.conditions ? "The laser may be used only under the conditions below." : "No conditions were added.");
    if (d.supersededNumbers?.length) paragraphs.push(`This sign-off replaces the one of revision ${d.supersededNumbers.join(", ")}.`);
  } else {
    paragraphs.push("The laser must stay off for this setup. A changed drawing makes a new revision, which can be sent for review again.");
  }
  const extra: Fact[] = [
    ["Decided by", `${d.signerName}, ${d.signerRole}`],
    ["Decided at", formatDateTime(d.decidedAt)],
  ];
  if (d.validUntil) extra.push(["Valid until", `${formatDate(d.validUntil)}, to the end of that day`]);
  const quote =
    d.outcome === "approved"
      ? d.conditions
        ? { label: "Conditions", text: d.conditions }
        : undefined
      : d.reason
        ? { label: d.outcome === "rejected" ? "Reason" : "What to change", text: d.reason }
        : undefined;
  return compose({
    to,
    subject: `${words.subject}: ${ctx.benchTitle}, revision ${ctx.revisionNumber}`,
    title: words.title,
    paragraphs,
    facts: facts(ctx, extra),
    quote,
    ...(to.builds && d.outcome === "approved"
      ? { linkLabel: "Open it to start the build", url: buildListUrl(ctx.revisionId) }
      : { linkLabel: "Open the revision", url: revisionUrl(ctx.revisionId) }),
  });
}

export function expiryReminderMail(to: Recipient, ctx: RevisionMailContext, r: { daysLeft: number; validUntil: Date; signerName: string }): MailMessage {
  return compose({
    to,
    subject: `Sign-off ends in ${r.daysLeft} day${r.daysLeft === 1 ? "" : "s"}: ${ctx.benchTitle}, revision ${ctx.revisionNumber}`,
    title: "A sign-off is about to end",
    paragraphs: [
      `The sign-off of revision ${ctx.revisionNumber} of "${ctx.benchTitle}" by ${r.signerName} ends on ${formatDate(r.validUntil)}.`,
      "After that day the laser must not be used on this setup until a revision is signed off again. To keep working, send the bench for review in good time.",
    ],
    facts: facts(ctx, [["Valid until", formatDate(r.validUntil)]]),
    linkLabel: "Open the revision",
    url: revisionUrl(ctx.revisionId),
  });
}

export function approvalExpiredMail(to: Recipient, ctx: RevisionMailContext, r: { validUntil: Date; signerName: string }): MailMessage {
  return compose({
    to,
    subject: `Sign-off expired: ${ctx.benchTitle}, revision ${ctx.revisionNumber}`,
    title: "A sign-off has expired",
    paragraphs: [
      `The sign-off of revision ${ctx.revisionNumber} of "${ctx.benchTitle}" by ${r.signerName} ended on ${formatDate(r.validUntil)}.`,
      "The laser must not be used on this setup until a revision is signed off again.",
    ],
    facts: facts(ctx, [["Valid until", formatDate(r.validUntil)]]),
    linkLabel: "Open the revision",
    url: revisionUrl(ctx.revisionId),
  });
}

export function reviewCommentMail(to: Recipient, ctx: RevisionMailContext, c: { commenterName: string; commenterRole: string; body: string; elementId: string | null }): MailMessage {
  const where = c.elementId ? ` about the element "${c.elementId}"` : "";
  return compose({
    to,
    subject: `New comment on ${ctx.benchTitle}, revision ${ctx.revisionNumber}`,
    title: "A new review comment",
    paragraphs: [`${c.commenterName} (${c.commenterRole}) wrote${where} on revision ${ctx.revisionNumber} of "${ctx.benchTitle}".`],
    facts: facts(ctx),
    quote: { label: "Comment", text: c.body },
    linkLabel: "Answer in Benchwarden",
    url: revisionUrl(ctx.revisionId),
  });
}
