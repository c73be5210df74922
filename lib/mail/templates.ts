// E-mail messages as data: every message has a plain-text part and an HTML part.
export type MailMessage = { to: string; subject: string; text: string; html: string };

export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] ?? c);
}

function layout(title: string, paragraphs: string[], link?: { url: string; label: string }): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join("");
  const button = link
    ? `<p style="margin:16px 0"><a href="${escapeHtml(link.url)}" style="background:#0f3d3e;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p><p style="font-size:12px;color:#555">Or open: ${escapeHtml(link.url)}</p>`
    : "";
  return `<!doctype html><html><body style="font-family:sans-serif;font-size:15px;color:#111;max-width:560px"><h1 style="font-size:18px">${escapeHtml(title)}</h1>${body}${button}<p style="font-size:12px;color:#555">Benchwarden — laser bench planning and sign-off</p></body></html>`;
}

export function passwordResetMail(input: { to: string; name: string; url: string }): MailMessage {
  const lines = [
    `Hello ${input.name},`,
    "Someone (we hope you) asked to reset your Benchwarden password. The link below works for one hour.",
    "If you did not ask for this, ignore this message; your password stays as it is.",
  ];
  return {
    to: input.to,
    subject: "Reset your Benchwarden password",
    text: `${lines.join("\n\n")}\n\n${input.url}\n`,
    html: layout("Reset your password", lines, { url: input.url, label: "Choose a new password" }),
  };
}

export function invitationMail(input: { to: string; name: string; invitedBy: string; roles: string; url: string }): MailMessage {
  const lines = [
    `Hello ${input.name},`,
    `${input.invitedBy} has invited you to Benchwarden as ${input.roles}.`,
    "Open the link below to choose your password. It works for 7 days.",
  ];
  return {
    to: input.to,
    subject: "Your Benchwarden invitation",
    text: `${lines.join("\n\n")}\n\n${input.url}\n`,
    html: layout("You are invited to Benchwarden", lines, { url: input.url, label: "Accept the invitation" }),
  };
}
