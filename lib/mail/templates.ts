import type { Mail } from "./transport";

/** Escapes text for HTML mail bodies: names and crew names are user input. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** The one look of Sortie's mails: `title`, `paragraphs` and `footer` are HTML the caller has escaped. */
export function layout(title: string, paragraphs: string[], action: { label: string; url: string }, footer: string): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${p}</p>`).join("");
  return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#0b1d2a;background:#f3f6f4;padding:24px">
<div style="max-width:520px;margin:auto;background:#fff;border-radius:10px;padding:24px;border:1px solid #d5dfd9">
<div style="font-weight:700;letter-spacing:.08em;color:#0f5e63;margin-bottom:16px">SORTIE</div>
<h1 style="font-size:20px;margin:0 0 14px">${title}</h1>${body}
<p style="margin:22px 0"><a href="${escapeHtml(action.url)}" style="background:#0f5e63;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p>
<p style="font-size:12px;color:#51636e">${footer}</p></div></body></html>`;
}

export function invitationMail(args: {
  to: string;
  crewName: string;
  role: string;
  invitedByName: string;
  url: string;
  expiresAt: Date;
}): Mail {
  const { crewName, role, invitedByName, url, expiresAt } = args;
  const until = expiresAt.toUTCString();
  return {
    to: args.to,
    subject: `You are invited to join ${crewName} on Sortie`,
    text:
      `${invitedByName} invited you to join the crew "${crewName}" on Sortie as ${role}.\n\n` +
      `Accept the invitation: ${url}\n\nThe link works once and expires ${until}. ` +
      `If you did not expect this, ignore this message.`,
    html: layout(
      `Join ${escapeHtml(crewName)}`,
      [
        `${escapeHtml(invitedByName)} invited you to join the crew <b>${escapeHtml(crewName)}</b> on Sortie as <b>${escapeHtml(role)}</b>.`,
        `Sortie keeps the crew's run logs, link checks and debriefs in one place.`,
      ],
      { label: "Accept the invitation", url },
      `The link works once and expires ${escapeHtml(until)}. If you did not expect this, ignore this message.`,
    ),
  };
}

export function passwordResetMail(args: { to: string; name: string; url: string; expiresAt: Date }): Mail {
  const until = args.expiresAt.toUTCString();
  return {
    to: args.to,
    subject: "Reset your Sortie password",
    text:
      `Hello ${args.name},\n\nSomeone (hopefully you) asked to reset the password of this Sortie account.\n\n` +
      `Choose a new password: ${args.url}\n\nThe link works once and expires ${until}. ` +
      `If you did not ask for this, ignore this message; your password stays as it is.`,
    html: layout(
      "Reset your password",
      [`Hello ${escapeHtml(args.name)},`, "Someone (hopefully you) asked to reset the password of this Sortie account."],
      { label: "Choose a new password", url: args.url },
      `The link works once and expires ${escapeHtml(until)}. If you did not ask for this, ignore this message; your password stays as it is.`,
    ),
  };
}
