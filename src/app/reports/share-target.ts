/** What is shared or commented on: a report or a series; both have access links and comments. */
export type ShareTarget = { kind: 'report'; id: number } | { kind: 'series'; id: number };

/** The API path of the shared thing, under which its links and comments live. */
export function targetPath(target: ShareTarget): string {
  return target.kind === 'report' ? `/api/reports/${target.id}` : `/api/series/${target.id}`;
}

/** "report" or "series", for sentences. */
export function targetNoun(target: ShareTarget): string {
  return target.kind;
}
