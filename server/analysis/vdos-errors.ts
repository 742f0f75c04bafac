/**
 * Standard errors of what the VDOS card shows — kinetic temperature, heat
 * capacity, entropy, zero-point energy and peak positions — from independent
 * groups of atoms (SCIENCE item 30): each block's spectrum is normalised to
 * the same number of modes and read exactly as the whole one, and the spread
 * of the block values over √B is the error. With the kinetic temperature
 * each block uses its own, so its uncertainty is carried into Cv and S.
 *
 * A peak position is read between samples by a parabola through the log of
 * the three highest; that reading is good to about a tenth of a bin (SCIENCE
 * item 5), which is added in quadrature to the block spread so that a sharp
 * line, identical in every block, still gets an honest error.
 */
import { BOLTZMANN_ENGINE } from './constants.ts';
import { harmonicThermo } from './harmonic-thermo.ts';
import { blockStandardError, MIN_BLOCKS } from './independent-blocks.ts';

/** How far between samples a peak reading can be trusted, in bins. */
export const PEAK_INTERPOLATION_BINS = 0.1;

export interface VdosBlock {
  /** Mass-weighted one-sided power of the block's atoms (corrected if from positions). */
  power: Float64Array;
  /** Σ m⟨v²⟩ of the block's true velocities, u·Å²/ps². */
  kinetic: number;
  atoms: number;
}

export interface VdosErrors {
  blocks: number;
  kineticTemperatureK: number;
  cvPerAtomKB: number;
  entropyPerAtomKB: number;
  zeroPointPerAtomEV: number;
  /** Per listed peak, the standard error of its position in THz, interpolation included (null where too few blocks show it). */
  peakThz: (number | null)[];
}

export interface VdosErrorInput {
  freqTHz: Float64Array;
  blocks: VdosBlock[];
  /** Degrees of freedom and atoms of the whole analysed group. */
  degreesOfFreedom: number;
  nAtoms: number;
  totalMassU: number;
  /** A temperature chosen for the harmonic quantities; each block's kinetic one otherwise. */
  chosenK?: number;
  peaks: { thz: number; fwhmThz: number }[];
}

export function vdosErrors(input: VdosErrorInput): VdosErrors | null {
  const { freqTHz, blocks, degreesOfFreedom: dof, nAtoms } = input;
  if (blocks.length < MIN_BLOCKS) return null;
  const dNu = freqTHz[1] - freqTHz[0];
  const temperatures: number[] = [], cv: number[] = [], entropy: number[] = [], zpe: number[] = [];
  const positions: number[][] = input.peaks.map(() => []);
  for (const b of blocks) {
    const blockDof = (dof * b.atoms) / nAtoms;
    const kineticK = b.kinetic / (blockDof * BOLTZMANN_ENGINE);
    let area = 0;
    for (let k = 0; k < b.power.length; k++) area += (k === 0 || k === b.power.length - 1 ? 0.5 : 1) * b.power[k];
    if (!(area > 0) || !(kineticK > 0)) continue;
    const dos = b.power.map((p) => (p * dof) / (area * dNu));
    const h = harmonicThermo(freqTHz, dos, input.chosenK ?? kineticK, nAtoms, input.totalMassU);
    temperatures.push(kineticK);
    cv.push(h.quantum.cvPerAtomKB);
    entropy.push(h.quantum.entropyPerAtomKB);
    zpe.push(h.quantum.zeroPointPerAtomEV);
    input.peaks.forEach((p, i) => {
      const found = localPeak(freqTHz, dos, p.thz, Math.max(2 * dNu, 0.5 * (Number.isFinite(p.fwhmThz) ? p.fwhmThz : 0)));
      if (found !== null) positions[i].push(found);
    });
  }
  if (cv.length < MIN_BLOCKS) return null;
  return {
    blocks: cv.length,
    kineticTemperatureK: blockStandardError(temperatures),
    cvPerAtomKB: blockStandardError(cv),
    entropyPerAtomKB: blockStandardError(entropy),
    zeroPointPerAtomEV: blockStandardError(zpe),
    peakThz: positions.map((list) => (list.length >= MIN_BLOCKS ? Math.hypot(blockStandardError(list), PEAK_INTERPOLATION_BINS * dNu) : null)),
  };
}

/** The highest sample within ±halfWidth of a position, centred by a parabola through the log of its neighbours. */
function localPeak(freq: Float64Array, dos: Float64Array, centre: number, halfWidth: number): number | null {
  const dNu = freq[1] - freq[0];
  const lo = Math.max(1, Math.floor((centre - halfWidth) / dNu)), hi = Math.min(dos.length - 2, Math.ceil((centre + halfWidth) / dNu));
  let best = -1;
  for (let k = lo; k <= hi; k++) if (best < 0 || dos[k] > dos[best]) best = k;
  if (best < 0 || !(dos[best] > 0)) return null;
  let offset = 0;
  if (dos[best - 1] > 0 && dos[best + 1] > 0) {
    const a = Math.log(dos[best - 1]), b = Math.log(dos[best]), c = Math.log(dos[best + 1]);
    const denom = a - 2 * b + c;
    if (denom < 0) offset = Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / denom));
  }
  return freq[best] + offset * dNu;
}
