export type InboxMessage = { id: string; subject: string; text: string; html: string | null; to: string[] };

const inboxUrl = () => process.env.INBOX_URL ?? 'http://127.0.0.1:1080';

/** Messages the local SMTP fake captured for one address, newest first. */
export async function messagesTo(address: string): Promise<InboxMessage[]> {
  const res = await fetch(`${inboxUrl()}/api/messages?to=${encodeURIComponent(address.toLowerCase())}`);
  if (!res.ok) throw new Error(`inbox answered ${res.status}`);
  return ((await res.json()) as { messages: InboxMessage[] }).messages;
}

/** Waits (bounded) for a message to an address whose subject contains the given text. */
export async function waitForMessage(address: string, subject: string, timeoutMs = 10_000): Promise<InboxMessage> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = (await messagesTo(address)).find((m) => m.subject.includes(subject));
    if (found) return found;
    if (Date.now() > until) throw new Error(`no message "${subject}" to ${address} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export function firstLink(text: string, path: string): string {
  const match = text.match(new RegExp(`https?://\\S*${path}\\S*`));
  if (!match) throw new Error(`no link containing ${path} in:\n${text}`);
  return match[0];
}
