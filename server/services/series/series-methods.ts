/**
 * The methods text of a series: which members, which analyses with which
 * settings, how temperatures, fits and phase names were decided. One
 * paragraph per item, so the page and the exports print the same words.
 */
import type { SeriesResults } from '../../../shared/series-results.ts';
import type { SyncedMember } from './series-sync.ts';

const K = (t: number): string => `${Number(t.toPrecision(4))} K`;

export function methodsText(members: readonly SyncedMember[], results: SeriesResults | null): string[] {
  const species = Object.keys(members[0]?.row.trajectory.speciesCounts ?? {}).sort();
  const list = members.map(({ row }) => {
    const t = row.trajectory;
    const stated = t.temperatureK !== null ? `stated ${K(t.temperatureK)}` : 'no stated temperature';
    const flags = [row.branch, row.excludedFromFit ? 'excluded from fits' : null].filter(Boolean).join(', ');
    return `${t.name} (${t.atoms ?? '?'} atoms, ${stated}${flags ? `, ${flags}` : ''})`;
  });
  const reports = [...new Set(members.flatMap((m) => Object.values(m.plan.reportByAnalysis)))].sort((a, b) => a - b);
  const analyses = [...new Set(members.flatMap((m) => m.plan.needed))];
  const paragraphs = [
    `Members: ${members.length} runs of one system (species ${species.join(', ') || 'unknown'}), in this order: ${list.join('; ')}.`,
    `Analyses: ${analyses.join(', ')} of every member with the default settings (all frames, none discarded for equilibration, automatic fit windows); `
      + 'energy only where a run has an interaction model or energies in its file. A finished report made with the same settings is reused rather than run again'
      + (reports.length ? `; results are read from reports ${reports.map((r) => `#${r}`).join(', ')}.` : '.'),
    'Temperature: each member is placed at its measured kinetic temperature (thermo analysis, block standard error) when it has one, else at its stated temperature.',
    'D(T): the Einstein diffusion coefficient of all atoms from each member\'s MSD, with its block standard error. '
      + 'Arrhenius fit ln D = ln D₀ − E_a/(RT) by weighted least squares on 1/T, weights 1/σ²(ln D); when the points scatter more than their errors, '
      + 'the parameter errors are scaled by √(χ²/ν). Members whose D is zero within two standard errors, and members excluded by the user, are left out.',
  ];
  if (results) {
    const c = results.criteria;
    paragraphs.push(
      `Phase per member, from its evidence: D zero within ${c.mobilitySigmas} standard errors (solid); Lindemann ratio below ${c.lindemannSolidBelow} (solid-like) `
        + `or above ${c.lindemannFluidAbove} (atoms left their sites); g(r) first-shell minimum over peak below ${c.rdfOrderedBelow} (crystal-like), `
        + `above ${c.rdfGasAbove} (gas-like); packing n·r₁³ at least ${c.packingCondensedAbove} (condensed) or below ${c.packingDiluteBelow} (dilute); `
        + `density at least ${c.densityCondensedFraction} (condensed) or below ${c.densityDiluteFraction} (dilute) of the densest condensed member; `
        + `S(q) main peak at least ${c.structureFactorFreezing} (freezing value) or below ${c.structureFactorGasBelow} (gas-like). `
        + 'Diffusion decides first; evidence that contradicts it makes the phase "unclear" rather than a guess.',
      'Melting and boiling: bracketed between the highest member in the lower phase and the lowest member in the higher one, for the whole series and for each heating or cooling branch. '
        + results.melting.caution,
      `Caloric curve: ${results.caloric.note} Latent heat: ${results.caloric.latentHeat?.method ?? results.caloric.latentHeatNote} `
        + 'Heat capacity: dE/dT between neighbouring members of one branch, each member\'s energy fluctuations where it has energies, and the harmonic value from its VDOS.',
    );
  }
  return paragraphs;
}
