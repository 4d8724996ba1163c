/** The local SMTP stand-in's JSON API (scripts/mail-server.mjs); `npm test` sets MAIL_INBOX_URL. */
export interface InboxMessage {
  id: string;
  to: string[];
  subject: string;
  text: string;
  date: string;
}

/**
 * The newest message to `address`, or with `about` the newest whose subject contains it: mail goes out
 * from the outbox after the request returns, and other specs mail the same demo people.
 */
export async function waitForMessageTo(address: string, { about, timeoutMs = 10_000 }: { about?: string; timeoutMs?: number } = {}): Promise<InboxMessage> {
  const inbox = process.env.MAIL_INBOX_URL ?? 'http://127.0.0.1:1081';
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const response = await fetch(`${inbox}/api/messages?to=${encodeURIComponent(address)}`);
    const body = await response.json();
    const messages: InboxMessage[] = (Array.isArray(body) ? body : body.messages).filter((m: InboxMessage) => !about || m.subject.includes(about));
    if (messages.length > 0) return [...messages].sort((a, b) => b.date.localeCompare(a.date))[0];
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  throw new Error(`No e-mail${about ? ` about "${about}"` : ''} reached ${address} within ${timeoutMs} ms`);
}

export function inviteLinkIn(message: InboxMessage): string {
  const match = message.text.match(/https?:\/\/\S+\/invite\/[A-Za-z0-9_-]+/);
  if (!match) throw new Error(`No invitation link in "${message.subject}"`);
  return match[0];
}
