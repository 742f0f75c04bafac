/**
 * Building blocks of the API's request and response schemas, so every route
 * words the same rule the same way and every date travels the same way.
 */
import { z } from 'zod';
import { describeForbiddenCharacter } from './plain-text.ts';

/** Dates travel as ISO 8601 strings in UTC, e.g. "2026-03-01T09:30:00.000Z". */
export const isoDate = z.iso.datetime({ offset: true });

export const recordId = z.number().int().positive();

/** Someone named in an answer: enough to show, never their e-mail. */
export const personRef = z.object({ id: recordId, displayName: z.string() });

/** Text fields of a request: trimmed, not empty, bounded. */
export function requiredText(max: number) {
  return z.string({ error: 'is required' }).trim().min(1, 'must not be empty').max(max, `must be at most ${max} characters`);
}

/** A name shown to others (person, project, token): required text on one line, without direction overrides. */
export function nameText(max: number) {
  return requiredText(max).superRefine((value, check) => {
    const problem = describeForbiddenCharacter(value);
    if (problem) check.addIssue({ code: 'custom', message: `must not contain ${problem}` });
  });
}
