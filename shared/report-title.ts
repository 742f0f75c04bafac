/**
 * A report's title: the file, the analyses, and every setting that differs
 * from the default and matters to one of those analyses — so two reports of
 * the same file made with different settings read differently in a list.
 */
import { analysisParamsSchema, type AnalysisParams } from './analysis-params.ts';
import { analysesText } from './analysis-labels.ts';

const TITLE_MAX = 255;
const ALL = ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'ngp', 'energy'];

type Window = AnalysisParams['fitWindow'];

const num = (x: number) => Number(x.toPrecision(4)).toString();
const span = (w: Window) => (w.mode === 'manual' ? `${num(w.startPs)}–${num(w.endPs)} ps` : null);

/** Each setting: the analyses it changes, and its words when it differs from the default (null when it does not). */
const DESCRIBERS: { applies: string[]; words: (p: AnalysisParams, d: AnalysisParams) => string | null }[] = [
  { applies: ALL, words: (p) => (p.species.length ? `species ${p.species.join(', ')}` : null) },
  { applies: ALL, words: (p, d) => (p.components !== d.components ? `${p.components} components` : null) },
  { applies: ['msd', 'vacf', 'vdos', 'ngp'], words: (p) => (p.maxLagPs !== undefined ? `lags ≤ ${num(p.maxLagPs)} ps` : null) },
  { applies: ['msd'], words: (p) => (span(p.fitWindow) ? `fit ${span(p.fitWindow)}` : null) },
  { applies: ['vacf'], words: (p) => (span(p.greenKuboWindow) ? `Green–Kubo plateau ${span(p.greenKuboWindow)}` : null) },
  { applies: ['vdos'], words: (p, d) => (p.window !== d.window ? `${p.window} window` : null) },
  { applies: ['vdos'], words: (p, d) => (p.zeroPadFactor !== d.zeroPadFactor ? `zero padding ×${p.zeroPadFactor}` : null) },
  { applies: ['vdos'], words: (p) => (p.temperatureK !== undefined ? `Cv at ${num(p.temperatureK)} K` : null) },
  { applies: ['thermo', 'vdos', 'energy'], words: (p) => (p.degreesOfFreedom !== undefined ? `${p.degreesOfFreedom} degrees of freedom` : null) },
  { applies: ['thermo', 'vdos', 'energy'], words: (p, d) => (p.constraints !== d.constraints ? `${p.constraints} constraints` : null) },
  { applies: ['rdf', 'sq'], words: (p) => (p.pair ? `pair ${p.pair.join('–')}` : null) },
  { applies: ['rdf', 'sq'], words: (p) => (p.rMaxA !== undefined ? `r ≤ ${num(p.rMaxA)} Å` : null) },
  { applies: ['rdf', 'sq'], words: (p, d) => (p.binWidthA !== d.binWidthA ? `bins ${num(p.binWidthA)} Å` : null) },
  { applies: ['sq'], words: (p, d) => (p.sqWindow !== d.sqWindow ? `S(q) window ${p.sqWindow}` : null) },
  { applies: ['sq'], words: (p) => (p.qMaxInvA !== undefined ? `q ≤ ${num(p.qMaxInvA)} Å⁻¹` : null) },
  { applies: ALL, words: (p, d) => (p.removeComDrift !== d.removeComDrift ? 'centre-of-mass drift kept' : null) },
  { applies: ALL, words: (p) => {
    const masses = Object.entries(p.masses);
    return masses.length ? `masses ${masses.map(([k, m]) => `${k} ${num(m)} u`).join(', ')}` : null;
  } },
];

/** The settings of a run that differ from the defaults, in words, for the analyses it ran. */
export function keySettings(analyses: readonly string[], params: unknown): string[] {
  const parsed = analysisParamsSchema.safeParse(params ?? {});
  if (!parsed.success) return [];
  const defaults = analysisParamsSchema.parse({});
  return DESCRIBERS.filter((d) => d.applies.some((a) => analyses.includes(a)))
    .map((d) => d.words(parsed.data, defaults)).filter((w): w is string => w !== null);
}

export function reportTitle(trajectoryName: string, analyses: readonly string[], params: unknown): string {
  const settings = keySettings(analyses, params);
  const title = `${trajectoryName}: ${analysesText(analyses)}${settings.length ? ` — ${settings.join(', ')}` : ''}`;
  return title.length <= TITLE_MAX ? title : `${title.slice(0, TITLE_MAX - 1)}…`;
}
