/**
 * Reads what the local SMTP stand-in received, through its JSON API (scripts/mail-server.mjs).
 * `npm test` sets MAIL_INBOX_URL to the test instance's inbox.
 */
export interface InboxMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
  date: string;
}

export function inboxUrl(): string {
  const url = process.env.MAIL_INBOX_URL;
  if (!url) throw new Error('MAIL_INBOX_URL is not set: run these tests through `npm test` (it starts the mail stand-in).');
  return url;
}

export async function messagesTo(address: string): Promise<InboxMessage[]> {
  const response = await fetch(`${inboxUrl()}/api/messages?to=${encodeURIComponent(address)}`);
  if (!response.ok) throw new Error(`Inbox answered ${response.status}`);
  const body = await response.json();
  return Array.isArray(body) ? body : body.messages;
}

/** The first link into the app found in a message's text. */
export function appLinkIn(message: InboxMessage, pathPrefix: string): string {
  const match = message.text.match(new RegExp(`https?://[^\\s]+${pathPrefix.replace(/\//g, '\\/')}[^\\s]*`));
  if (!match) throw new Error(`No ${pathPrefix} link in "${message.subject}"`);
  return match[0];
}
