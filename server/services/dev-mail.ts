import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { simpleParser, type AddressObject } from 'mailparser';
import { AppError } from '../errors.ts';
import type { SentMail } from '../../shared/admin.ts';


function addresses(field: AddressObject | AddressObject[] | undefined): string {
  if (!field) return '';
  return (Array.isArray(field) ? field : [field]).map((a) => a.text).join(', ');
}

/** The newest messages the SMTP fake kept, for clicking through e-mail flows locally. */
export async function listDevMail(mailDir: string | undefined, limit = 50): Promise<SentMail[]> {
  if (!mailDir) throw new AppError(404, 'not_found', 'The dev mail page is off: MAIL_FAKE_DIR is not set.');
  const names = (await readdir(mailDir)).filter((n) => n.endsWith('.eml')).sort().slice(-limit).reverse();
  return Promise.all(names.map(async (name) => {
    const parsed = await simpleParser(await readFile(join(mailDir, name)));
    return { id: name, to: addresses(parsed.to), subject: parsed.subject ?? '', date: parsed.date && Number.isFinite(parsed.date.getTime()) ? parsed.date.toISOString() : null, text: parsed.text ?? '' };
  }));
}
