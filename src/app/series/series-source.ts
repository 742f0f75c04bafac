/** Where a series was opened from: a member's session, or an access link's token. */
export type SeriesSource = { kind: 'member'; seriesId: number } | { kind: 'link'; token: string };

export function seriesUrl(seriesId: number): string {
  return `/api/series/${seriesId}`;
}

/** Every member's curves for the overlays, through the route the reader may use. */
export function seriesCurvesUrl(source: SeriesSource): string {
  return source.kind === 'member' ? `${seriesUrl(source.seriesId)}/curves` : `/api/links/${encodeURIComponent(source.token)}/series-curves`;
}

/** The whole series (members, results, methods, caution) as a JSON download. */
export function seriesJsonUrl(source: SeriesSource): string {
  return source.kind === 'member' ? `${seriesUrl(source.seriesId)}/export.json` : `/api/links/${encodeURIComponent(source.token)}/export.json`;
}

/** One row per member with units in the header; members of the project only. */
export function seriesMembersCsvUrl(seriesId: number): string {
  return `${seriesUrl(seriesId)}/members.csv`;
}
