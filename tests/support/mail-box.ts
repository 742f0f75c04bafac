import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';

export interface ReceivedMail {
  to: string;
  subject: string;
  text: string;
}

/** Every message the SMTP fake kept for one recipient, oldest first. */
export async function mailTo(mailDir: string, recipient: string): Promise<ReceivedMail[]> {
  const names = (await readdir(mailDir)).filter((n) => n.endsWith('.eml')).sort();
  const found: ReceivedMail[] = [];
  for (const name of names) {
    const parsed = await simpleParser(await readFile(join(mailDir, name)));
    const to = [parsed.to ?? []].flat().map((a) => a.text).join(', ');
    if (to.toLowerCase().includes(recipient.toLowerCase())) found.push({ to, subject: parsed.subject ?? '', text: parsed.text ?? '' });
  }
  return found;
}

/** Waits for the count-th message to a recipient (mail may be sent in the background). */
export async function waitForMail(mailDir: string, recipient: string, count = 1, timeoutMs = 10_000): Promise<ReceivedMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const messages = await mailTo(mailDir, recipient);
    if (messages.length >= count) return messages[count - 1]!;
    if (Date.now() > deadline) throw new Error(`no e-mail number ${count} to ${recipient} within ${timeoutMs} ms (found ${messages.length})`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** The token at the end of the first link in a message whose path starts with `path`. */
export function tokenFromLink(text: string, path: string): string {
  const match = new RegExp(`https?://[^\\s]+${path.replace(/[/?]/g, '\\$&')}([A-Za-z0-9_%-]+)`).exec(text);
  if (!match?.[1]) throw new Error(`no link to ${path} in:\n${text}`);
  return decodeURIComponent(match[1]);
}
