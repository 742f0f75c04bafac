/** Short names of the analyses, for titles, lists and tags where the checklist's titles are too long. */
export const ANALYSIS_WORDS: Partial<Record<string, string>> = {
  thermo: 'temperature', msd: 'MSD', vacf: 'VACF', vdos: 'VDOS', rdf: 'g(r)', sq: 'S(q)', lindemann: 'Lindemann', ngp: 'α₂', energy: 'energy',
};

export function analysesText(keys: readonly string[]): string {
  return keys.map((k) => ANALYSIS_WORDS[k] ?? k).join(', ');
}
