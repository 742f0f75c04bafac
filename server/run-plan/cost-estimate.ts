/**
 * How long and how much memory a run will take, from atoms × frames ×
 * analyses, before it is queued. Each analysis is counted in work units of
 * its own algorithm (FFT butterflies, pair distances, per-atom-frame
 * passes), and units are priced in nanoseconds measured on one core of a
 * 2020s x86 machine by `npm run bench` (which prints estimate against
 * actual). Estimates aim at the right order, within about a factor of two.
 */
import type { AnalysisKey } from '../../shared/analysis-params.ts';
import { ATOM_CHUNK_BYTES, BLOCK_BYTES } from '../out-of-core/block-file.ts';
import { IN_MEMORY_COORDINATE_BYTES } from '../out-of-core/scratch.ts';
import { BRUTE_FORCE_MAX_ATOMS } from '../analysis/pair-histogram.ts';

/** Nanoseconds per work unit, measured by bench/cost-model.ts (which prints estimate against actual). */
export const NS_PER_UNIT = {
  /** One coordinate value read from the frame store and assembled. */
  load: 4,
  /** One atom-frame of a per-frame pass (kinetic energy, unwrapping, centre-of-mass removal). */
  atomFrame: 25,
  /** One butterfly-level of a real FFT of one coordinate series (L·log2 L per series). */
  fft: 4,
  /**
   * One pair distance g(r)'s cell lists visit, and one of those closer than
   * r_max put in the histogram (square root, bin). Their sum at the half
   * filling of r_max = L/2 is about the 27 ns per pair bench/cost-model.ts
   * measured for all pairs of 500 atoms on the 2-core build machine; the
   * split (binning about twice a bare distance) was measured on a 4000-atom
   * gas with r_max = L/20 and L/2. Rounded up rather than down: a limit
   * should refuse a run before it starts, not let it run past the limit.
   */
  rdfPair: 12,
  rdfBinned: 24,
  /** One pair distance of the Lindemann index (minimum image, square root, two sums); 500 atoms measured about 3× the former 25 ns. */
  lindemannPair: 75,
  /** One displacement of the non-Gaussian parameter; measured about 3× the former 6 ns. */
  ngpStep: 18,
  /** One pair energy and virial term. */
  energyPair: 20,
} as const;

/** What the runtime itself takes before any data (a worker thread with the engine loaded). */
export const BASE_MEMORY_BYTES = 120 * 1024 ** 2;

export interface CostInput {
  atoms: number;
  /** Frames the analyses see (after range, discard and stride). */
  frames: number;
  hasVelocities: boolean;
  /** Volume per atom in Å³ (for pair counts), or null without a cell. */
  volumePerAtomA3: number | null;
  /** g(r) range; null means half the shortest cell width, given as halfWidthA. */
  rMaxA: number | null;
  halfWidthA: number | null;
  /** Pair cut-off of the interaction model (energy analysis), Å. */
  cutoffA: number | null;
  /**
   * Positions and velocities the job may hold in memory (ANALYSIS_IN_MEMORY_BYTES);
   * beyond, they wait in a scratch file on disk. Default: the command line's budget.
   */
  inMemoryBytes?: number;
}

export interface AnalysisCost {
  key: AnalysisKey;
  seconds: number;
  /** Memory this analysis needs beyond the trajectory itself. */
  workingBytes: number;
}

export interface CostEstimate {
  seconds: number;
  memoryBytes: number;
  /** Reading the frames into memory. */
  loadSeconds: number;
  /** Memory the frames take while the analyses run: all of them, or a block and an atom chunk of the scratch file. */
  trajectoryBytes: number;
  /** Disk the scratch file takes in the temporary folder (0 when everything fits in memory). */
  scratchBytes: number;
  analyses: AnalysisCost[];
}

const log2 = (x: number) => Math.log2(Math.max(2, x));
const nextPow2 = (x: number) => 2 ** Math.ceil(log2(x));

/** Pair distances per frame for the energy's neighbour search out to r: cell lists when they apply (box ≥ 3r), else all pairs. */
function pairsPerFrame(input: CostInput, r: number): number {
  const n = input.atoms;
  const all = (n * (n - 1)) / 2;
  if (!input.volumePerAtomA3 || !input.halfWidthA || n <= 256) return all;
  if (r * 3 > 2 * input.halfWidthA) return all;
  // Cell lists visit 27 cells of side ≥ r around each atom, half of them per pair.
  const perAtom = (27 * r ** 3) / input.volumePerAtomA3;
  return Math.min(all, (n * perAtom) / 2);
}

/**
 * g(r) per frame out to r: the pair distances its cell lists visit (cells no
 * narrower than r, the same and neighbouring cells) and those closer than r
 * that are binned. Cells are counted as if every side were as short as
 * the shortest (close enough for the factor of two the estimate aims at).
 */
function rdfPairsPerFrame(input: CostInput, r: number): { visited: number; binned: number } {
  const n = input.atoms;
  const all = (n * (n - 1)) / 2;
  if (!input.volumePerAtomA3 || !input.halfWidthA) return { visited: all, binned: all };
  const binned = Math.min(all, (n * ((4 * Math.PI) / 3) * r ** 3) / input.volumePerAtomA3 / 2);
  if (n <= BRUTE_FORCE_MAX_ATOMS) return { visited: all, binned };
  const cells = Math.max(1, Math.floor((2 * input.halfWidthA) / r));
  const reach = Math.min(cells, 3) * ((2 * input.halfWidthA) / cells);
  return { visited: Math.min(all, (n * reach ** 3) / input.volumePerAtomA3 / 2), binned };
}

function analysisCost(key: AnalysisKey, input: CostInput): AnalysisCost {
  const { atoms: n, frames: t } = input;
  const L = nextPow2(2 * t);
  const fftUnits = 3 * n * L * log2(L);
  const seconds = (units: number, price: number) => (units * price) / 1e9;
  const perAtomFrame = (passes: number) => seconds(passes * n * t, NS_PER_UNIT.atomFrame);
  switch (key) {
    case 'thermo':
      return { key, seconds: perAtomFrame(1), workingBytes: 64 * t };
    case 'msd':
      return { key, seconds: seconds(fftUnits, NS_PER_UNIT.fft) + perAtomFrame(2), workingBytes: 8 * 6 * L };
    case 'vacf':
      return { key, seconds: seconds(fftUnits, NS_PER_UNIT.fft) + perAtomFrame(input.hasVelocities ? 1 : 2), workingBytes: 8 * 8 * L };
    case 'vdos':
      // VDOS shares the VACF's pass; its own spectrum is one more FFT per atom series.
      return { key, seconds: seconds(fftUnits / 2, NS_PER_UNIT.fft), workingBytes: 16 * L };
    case 'rdf': {
      const r = input.rMaxA ?? input.halfWidthA ?? 10;
      const pairs = rdfPairsPerFrame(input, r);
      // 36 bytes an atom: wrapped positions, the cell lists' links and up to two list heads.
      return { key, seconds: seconds(t * pairs.visited, NS_PER_UNIT.rdfPair) + seconds(t * pairs.binned, NS_PER_UNIT.rdfBinned), workingBytes: 36 * n + 4 * 8 * 1024 * 16 };
    }
    case 'sq':
      return { key, seconds: 0.01, workingBytes: 1024 ** 2 };
    case 'lindemann': {
      // Periodic systems use the per-atom displacement form, one pass per atom-frame; only clusters pair every atom.
      if (input.volumePerAtomA3 !== null) return { key, seconds: perAtomFrame(3), workingBytes: 48 * n };
      const all = (n * (n - 1)) / 2;
      const allPairs = all <= 2e6;
      // Beyond 2·10⁶ pairs: neighbours within 1.4 spacings of the first frame, about six per atom, found by a full search.
      const pairs = allPairs ? all : n * 6;
      return { key, seconds: seconds(Math.min(pairs * t, 4e8) + (allPairs ? 0 : all), NS_PER_UNIT.lindemannPair) + perAtomFrame(1), workingBytes: 24 * pairs + 40 * n };
    }
    case 'ngp': {
      const lags = 20 * Math.log10(Math.max(10, t / 2));
      return { key, seconds: seconds(Math.min(n * t * lags, 2e8), NS_PER_UNIT.ngpStep) + perAtomFrame(1), workingBytes: 24 * t };
    }
    case 'energy': {
      const r = input.cutoffA ?? 10;
      return { key, seconds: seconds(t * pairsPerFrame(input, r), NS_PER_UNIT.energyPair) + perAtomFrame(1), workingBytes: 32 * n + 64 * t };
    }
  }
}

/**
 * What the coordinates take: in memory up to the budget; beyond, on disk,
 * with one block of frames (written as it is transposed) and one atom chunk
 * (read by the engine) in memory, as out-of-core/block-file.ts sizes them.
 */
function coordinateFootprint(input: CostInput): { memory: number; disk: number } {
  const kinds = input.hasVelocities ? 2 : 1;
  const bytes = input.frames * input.atoms * 12 * kinds;
  if (bytes <= (input.inMemoryBytes ?? IN_MEMORY_COORDINATE_BYTES)) return { memory: bytes, disk: 0 };
  const block = Math.max(BLOCK_BYTES, input.atoms * 12 * kinds);
  const atomChunk = Math.max(ATOM_CHUNK_BYTES, input.frames * 12);
  return { memory: block + atomChunk, disk: bytes };
}

export function estimateCost(analyses: readonly AnalysisKey[], input: CostInput): CostEstimate {
  const valuesPerFrame = input.atoms * 3 * (input.hasVelocities ? 2 : 1);
  const coordinates = coordinateFootprint(input);
  // Times and cells stay in memory per frame either way.
  const trajectoryBytes = coordinates.memory + input.frames * 80;
  const loadSeconds = (input.frames * valuesPerFrame * NS_PER_UNIT.load) / 1e9;
  const costs = [...new Set(analyses)].map((k) => analysisCost(k, input));
  const seconds = loadSeconds + costs.reduce((s, c) => s + c.seconds, 0);
  // Analyses run one after another, so only the largest working set adds to the trajectory.
  const working = costs.reduce((m, c) => Math.max(m, c.workingBytes), 0);
  return { seconds, memoryBytes: BASE_MEMORY_BYTES + trajectoryBytes + working, loadSeconds, trajectoryBytes, scratchBytes: coordinates.disk, analyses: costs };
}
