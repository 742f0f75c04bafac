import { expect, type Page } from '@playwright/test';

export interface UploadFile {
  name: string;
  buffer: Buffer;
}

/**
 * Picks files with the drop zone's "Choose files…" button as a person does,
 * then answers the upload dialog: optional metadata, then Upload.
 */
export async function chooseAndUpload(page: Page, files: UploadFile[], fill?: (dialog: ReturnType<Page['getByRole']>) => Promise<void>): Promise<void> {
  const choosing = page.waitForEvent('filechooser');
  await page.getByRole('button', { name: 'Choose files…' }).click();
  await (await choosing).setFiles(files.map((f) => ({ name: f.name, mimeType: 'text/plain', buffer: f.buffer })));
  const dialog = page.getByRole('dialog', { name: /^Upload / });
  await expect(dialog).toBeVisible();
  if (fill) await fill(dialog);
  await dialog.getByRole('button', { name: 'Upload' }).click();
  await expect(dialog).toBeHidden();
}
