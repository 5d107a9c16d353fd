/** One message as the local mail stand-in (ops/standins/mail-inbox.mjs) reports it. */
export interface InboxMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

function inboxUrl(): string {
  const url = process.env.MAIL_INBOX_URL;
  if (!url) throw new Error('MAIL_INBOX_URL is not set (start the tests through startTestApp or npm test)');
  return url.replace(/\/$/, '');
}

/** Every message the stand-in holds for `to` (oldest first). */
export async function messagesTo(to: string): Promise<InboxMessage[]> {
  const res = await fetch(`${inboxUrl()}/messages?to=${encodeURIComponent(to)}`);
  if (!res.ok) throw new Error(`mail inbox answered ${res.status}`);
  return (await res.json()) as InboxMessage[];
}

/**
 * Polls until a message for `to` arrives (optionally one whose subject matches), or fails after
 * `timeoutMs` (10 s by default).
 */
export async function waitForMessage(
  to: string,
  opts: { subject?: string | RegExp; timeoutMs?: number; intervalMs?: number } = {},
): Promise<InboxMessage> {
  const deadline = Date.now() + (opts.timeoutMs ?? 10_000);
  const matches = (m: InboxMessage) =>
    opts.subject === undefined ? true : typeof opts.subject === 'string' ? m.subject.includes(opts.subject) : opts.subject.test(m.subject);
  for (;;) {
    const found = (await messagesTo(to)).filter(matches);
    if (found.length) return found[found.length - 1];
    if (Date.now() > deadline) throw new Error(`no e-mail to ${to} arrived within ${opts.timeoutMs ?? 10_000} ms`);
    await new Promise((r) => setTimeout(r, opts.intervalMs ?? 100));
  }
}
