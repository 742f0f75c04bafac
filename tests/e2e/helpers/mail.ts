import { expect } from '@playwright/test';
import { mailTo } from '../../support/mail-box.ts';

/** The SMTP fake's folder, handed to the e2e run by `npm test -- e2e`. */
export function mailDir(): string {
  const env = process.env['ERGODIC_STACK_ENV'];
  if (!env) throw new Error('ERGODIC_STACK_ENV is not set: run end-to-end tests with `npm test -- e2e`.');
  const dir = (JSON.parse(env) as Record<string, string>)['MAIL_FAKE_DIR'];
  if (!dir) throw new Error('ERGODIC_STACK_ENV has no MAIL_FAKE_DIR');
  return dir;
}

/** Waits for a message to `recipient` and returns the first link in it that contains `path`. */
export async function linkInMailTo(recipient: string, path: string): Promise<string> {
  let link = '';
  await expect.poll(async () => {
    const messages = await mailTo(mailDir(), recipient);
    link = messages.flatMap((m) => m.text.match(/https?:\/\/\S+/g) ?? []).find((url) => url.includes(path)) ?? '';
    return link;
  }, { message: `an e-mail to ${recipient} with a link to ${path}` }).not.toBe('');
  return link;
}
