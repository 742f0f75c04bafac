import type { PhaseName } from '../../../../shared/series-results';

/** Each phase its own marker, so a point's phase reads without colour (colour already says temperature). */
export const PHASE_SYMBOL: Record<PhaseName, string> = { solid: 'rect', liquid: 'circle', vapour: 'triangle', unclear: 'diamond' };

/** Member names come from users: the chart tooltip is HTML, so they are escaped before they reach it. */
export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** A point's tooltip: the member's name, then one line per reading, all escaped. */
export function tipHtml(title: string, lines: readonly string[]): string {
  return [`<strong>${escapeHtml(title)}</strong>`, ...lines.map(escapeHtml)].join('<br/>');
}

/** Reads the tooltip text a point carries in its data item. */
export function tipOf(params: unknown): string {
  const data = (params as { data?: { tip?: unknown } } | null)?.data;
  return typeof data?.tip === 'string' ? data.tip : '';
}
