/** Reads the maildev inbox of the test run through its REST API (maildev 3 serves it under /api). */
const inboxUrl = process.env.SORTIE_INBOX_URL ?? "http://127.0.0.1:1090";

interface InboxMail {
  id: string;
  subject: string;
  text?: string;
  html?: string;
  to: { address: string }[];
  date: string;
}

export async function mailsTo(address: string): Promise<InboxMail[]> {
  const res = await fetch(`${inboxUrl}/api/email`);
  if (!res.ok) throw new Error(`inbox answered ${res.status}`);
  const all = (await res.json()) as InboxMail[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === address.toLowerCase()));
}

/** Waits for a message to `address` whose subject matches, and returns it. */
export async function waitForMail(address: string, subject: RegExp, timeoutMs = 10_000): Promise<InboxMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await mailsTo(address)).find((m) => subject.test(m.subject));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${address} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** The first link into the app with the given path prefix, e.g. "/invite/". */
export function linkIn(mail: InboxMail, pathPrefix: string): string {
  const text = mail.text ?? mail.html ?? "";
  const m = new RegExp(`https?://[^\\s"'<>]+${pathPrefix.replace(/\//g, "\\/")}[^\\s"'<>]+`).exec(text);
  if (!m) throw new Error(`no ${pathPrefix} link in mail "${mail.subject}"`);
  return m[0];
}

export function tokenFromLink(link: string): string {
  return decodeURIComponent(new URL(link).pathname.split("/").pop()!);
}
