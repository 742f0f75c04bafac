/**
 * The few numbers that tell reports of one system apart in a list — D, T,
 * the spectrum's peaks, the first shell — taken from the typed summary.
 */
import { z } from 'zod';
import type { ReportSummary } from './report-summary.ts';

export const keyNumbersSchema = z.object({
  /** Self-diffusion of all atoms in 10⁻⁹ m²/s, from the MSD (Einstein) or else the VACF (Green–Kubo). */
  diffusion: z.object({ e9M2PerS: z.number(), stdError: z.number().nullable(), method: z.enum(['Einstein', 'Green–Kubo']) }).nullable(),
  /** Mean kinetic temperature, K. */
  temperatureK: z.object({ mean: z.number(), stdError: z.number() }).nullable(),
  /** The largest VDOS peaks, cm⁻¹, in the order the summary lists them. */
  vdosPeaksCm1: z.array(z.number()),
  /** Position of the first g(r) peak of all atoms, Å. */
  rdfFirstPeakA: z.number().nullable(),
});
export type KeyNumbers = z.infer<typeof keyNumbersSchema>;

const MAX_PEAKS = 3;

function diffusionOf(summary: ReportSummary): KeyNumbers['diffusion'] {
  const msd = summary.msd?.groups.find((g) => g.label === 'all') ?? summary.msd?.groups[0];
  if (msd?.d) return { e9M2PerS: msd.d.e9M2PerS, stdError: msd.dStdError?.e9M2PerS ?? null, method: 'Einstein' };
  const vacf = summary.vacf?.groups.find((g) => g.label === 'all') ?? summary.vacf?.groups[0];
  if (vacf) return { e9M2PerS: vacf.dGreenKubo.e9M2PerS, stdError: vacf.spread.e9M2PerS, method: 'Green–Kubo' };
  return null;
}

export function keyNumbersOf(summary: ReportSummary): KeyNumbers {
  const rdf = summary.rdf?.pairs.find((p) => p.label === 'all') ?? summary.rdf?.pairs[0];
  return {
    diffusion: diffusionOf(summary),
    temperatureK: summary.thermo ? { mean: summary.thermo.temperatureK.mean, stdError: summary.thermo.temperatureK.stdError } : null,
    vdosPeaksCm1: (summary.vdos?.peaks ?? []).slice(0, MAX_PEAKS).map((p) => p.cm1),
    rdfFirstPeakA: rdf?.firstPeak?.rA ?? null,
  };
}
