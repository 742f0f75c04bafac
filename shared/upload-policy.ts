/**
 * What this site accepts as an upload (GET /api/upload-policy), and the one
 * message for a file over the limit, the same from the browser (which checks
 * before sending a byte) and from the server (which checks the declared
 * length, then the bytes as they arrive).
 */
import { z } from 'zod';
import { formatBytes } from './byte-size.ts';

export const uploadPolicySchema = z.object({
  /** Largest file one upload may carry, bytes (UPLOAD_MAX_BYTES). */
  fileMaxBytes: z.number().int().positive(),
  /** Largest a compressed upload may grow to when read, bytes (DECOMPRESSED_MAX_BYTES). */
  decompressedMaxBytes: z.number().int().positive(),
  /** Largest ratio of read to stored size of a compressed upload (DECOMPRESSION_MAX_RATIO). */
  decompressionMaxRatio: z.number().positive(),
});
export type UploadPolicy = z.infer<typeof uploadPolicySchema>;

const ADVICE = 'Compress it with gzip or zip (text trajectories shrink several-fold, and are read compressed), or ask the site administrator to raise UPLOAD_MAX_BYTES.';

/** The refusal of an upload over the limit; `size` names what was measured when it is known. */
export function tooLargeMessage(limitBytes: number, size?: { what: string; bytes: number }): string {
  const head = size ? `${size.what} is ${formatBytes(size.bytes)}, larger than` : 'The file is larger than';
  return `${head} the upload limit of ${formatBytes(limitBytes)}. ${ADVICE}`;
}

/** Why a file cannot be uploaded here, or null when its size is within the limit. */
export function uploadRefusal(file: { name: string; size: number }, limits: UploadPolicy): string | null {
  return file.size > limits.fileMaxBytes ? tooLargeMessage(limits.fileMaxBytes, { what: file.name, bytes: file.size }) : null;
}
