/** Accepts only paths inside this app, so a crafted ?next= cannot send anyone to another site. */
export function safeReturnUrl(candidate: string | null | undefined, fallback = '/projects'): string {
  if (!candidate || !candidate.startsWith('/') || candidate.startsWith('//') || candidate.startsWith('/\\')) return fallback;
  return candidate;
}
