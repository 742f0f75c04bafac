/** Where a report was opened from: a member's session, or an access link's token. */
export type ReportSource = { kind: 'member'; reportId: number } | { kind: 'link'; token: string };

function base(source: ReportSource): string {
  return source.kind === 'member' ? `/api/reports/${source.reportId}` : `/api/links/${encodeURIComponent(source.token)}`;
}

/** The CSV of one curve, through the route the reader is allowed to use. */
export function curveCsvUrl(source: ReportSource, curve: string): string {
  return `${base(source)}/curves/${encodeURIComponent(curve)}.csv`;
}

/** The whole report as a JSON download. */
export function reportJsonUrl(source: ReportSource): string {
  return `${base(source)}/export.json`;
}
