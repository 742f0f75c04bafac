/**
 * Pair-distance histogram of one frame in an orthorhombic periodic cell,
 * minimum image, each unordered pair once, binned by type pair.
 *
 * Linked cell lists: n = ⌊L/r_max⌋ cells per side, so no cell is narrower
 * than r_max and a pair closer than r_max (minimum image, r_max ≤ L/2) sits
 * in the same or a neighbouring cell. The work per frame is O(N·ρ·r_max³)
 * rather than O(N²) once there are more than three cells per side (with
 * three or fewer, the neighbours of a cell are the whole box). A side
 * with only one or two cells has fewer than three distinct neighbours
 * (offsets −1 and +1 are the same cell when n = 2), so each cell's
 * neighbours are the distinct cells among the offsets −1, 0, +1 taken
 * modulo n per side, and a pair of cells is counted from the lower-numbered
 * one only: every unordered atom pair exactly once for any r_max ≤ L/2.
 *
 * Up to BRUTE_FORCE_MAX_ATOMS atoms, 'auto' visits all pairs instead: there
 * a frame is at most some eight thousand distances, and building and
 * walking the lists costs about what it saves. Measured on one core (random
 * gas, r_max from L/2 to 0.3·L, a loaded machine, so roughly): all pairs
 * mostly faster, by up to a third, at 32–96 atoms; level at about 128; the
 * lists ahead from there, by 2.4× at 256 atoms with r_max = L/4.
 */
export const BRUTE_FORCE_MAX_ATOMS = 128;
/** Relative margin below r_max² treated as r_max (single-precision round-off of positions). */
export const R_MAX_ROUNDOFF = 4e-6;

export type PairMethod = 'auto' | 'cell-list' | 'brute-force';

export class PairHistogram {
  private readonly wrapped: Float64Array;
  private readonly next: Int32Array;
  private head = new Int32Array(0);
  /** Scratch: the neighbour cells of one cell that come after it (at most 26). */
  private readonly laterNeighbours = new Int32Array(26);
  lastMethod: 'cell-list' | 'brute-force' = 'brute-force';
  private lx = 0;
  private ly = 0;
  private lz = 0;
  private hx = 0;
  private hy = 0;
  private hz = 0;
  private readonly rMax2: number;
  private readonly binsPerA: number;

  constructor(
    private readonly nAtoms: number,
    /** Type index per atom. */
    private readonly types: Int32Array,
    /** Histogram slot per type pair, types.length² entries, −1 to skip. */
    private readonly pairSlot: Int32Array,
    private readonly nTypes: number,
    private readonly nBins: number,
    private readonly rMax: number,
    private readonly method: PairMethod = 'auto',
  ) {
    this.wrapped = new Float64Array(3 * nAtoms);
    this.next = new Int32Array(nAtoms);
    // Positions arrive in single precision; a pair sitting exactly at r_max
    // (e.g. the ±L/2 images in a crystal) must not slip in through round-off.
    this.rMax2 = rMax * rMax * (1 - R_MAX_ROUNDOFF);
    this.binsPerA = nBins / rMax;
  }

  /** Adds one frame's pair counts into hist[slot·nBins + bin]. */
  addFrame(positions: ArrayLike<number>, offset: number, box: [number, number, number], hist: Float64Array): void {
    const N = this.nAtoms;
    const w = this.wrapped;
    const [lx, ly, lz] = box;
    this.lx = lx;
    this.ly = ly;
    this.lz = lz;
    this.hx = lx / 2;
    this.hy = ly / 2;
    this.hz = lz / 2;
    for (let i = 0; i < N; i++) {
      const p = offset + 3 * i;
      w[3 * i] = wrap(positions[p], lx);
      w[3 * i + 1] = wrap(positions[p + 1], ly);
      w[3 * i + 2] = wrap(positions[p + 2], lz);
    }
    const useCells = this.method === 'cell-list' || (this.method === 'auto' && N > BRUTE_FORCE_MAX_ATOMS);
    this.lastMethod = useCells ? 'cell-list' : 'brute-force';
    if (useCells) {
      const [nx, ny, nz] = cellCounts(box, this.rMax, N);
      this.cellFrame(nx, ny, nz, hist);
    } else this.bruteFrame(hist);
  }

  private bruteFrame(hist: Float64Array): void {
    const N = this.nAtoms;
    for (let i = 0; i < N - 1; i++) this.countRange(i, i + 1, hist);
  }

  private cellFrame(nx: number, ny: number, nz: number, hist: Float64Array): void {
    const N = this.nAtoms, w = this.wrapped;
    const nCells = nx * ny * nz;
    if (this.head.length < nCells) this.head = new Int32Array(nCells);
    const head = this.head;
    head.fill(-1, 0, nCells);
    const next = this.next;
    const lx = this.lx, ly = this.ly, lz = this.lz;
    for (let i = 0; i < N; i++) {
      const cx = Math.min(nx - 1, Math.floor((w[3 * i] / lx) * nx));
      const cy = Math.min(ny - 1, Math.floor((w[3 * i + 1] / ly) * ny));
      const cz = Math.min(nz - 1, Math.floor((w[3 * i + 2] / lz) * nz));
      const c = (cz * ny + cy) * nx + cx;
      next[i] = head[c];
      head[c] = i;
    }
    const offX = distinctOffsets(nx), offY = distinctOffsets(ny), offZ = distinctOffsets(nz);
    const later = this.laterNeighbours;
    for (let cz = 0; cz < nz; cz++) {
      for (let cy = 0; cy < ny; cy++) {
        for (let cx = 0; cx < nx; cx++) {
          const c = (cz * ny + cy) * nx + cx;
          if (head[c] < 0) continue;
          // The distinct neighbour cells numbered above this one: each pair of cells is met once.
          let nLater = 0;
          for (const oz of offZ) {
            const z = (cz + oz + nz) % nz;
            for (const oy of offY) {
              const y = (cy + oy + ny) % ny;
              for (const ox of offX) {
                const c2 = (z * ny + y) * nx + ((cx + ox + nx) % nx);
                if (c2 > c && head[c2] >= 0) later[nLater++] = c2;
              }
            }
          }
          for (let i = head[c]; i >= 0; i = next[i]) {
            this.countList(i, next[i], next, hist);
            for (let s = 0; s < nLater; s++) this.countList(i, head[later[s]], next, hist);
          }
        }
      }
    }
  }

  // The two counting loops below share one body on purpose: a single loop
  // with a conditional "next j" rule runs markedly slower in V8. Both atoms
  // are wrapped into the cell, so one conditional shift per component is the
  // minimum image.

  /** Counts atom i against atoms first..N−1. */
  private countRange(i: number, first: number, hist: Float64Array): void {
    const w = this.wrapped, types = this.types, slots = this.pairSlot;
    const nB = this.nBins, last = nB - 1;
    const lx = this.lx, ly = this.ly, lz = this.lz, hx = this.hx, hy = this.hy, hz = this.hz;
    const rMax2 = this.rMax2, binsPerA = this.binsPerA;
    const xi = w[3 * i], yi = w[3 * i + 1], zi = w[3 * i + 2];
    const row = types[i] * this.nTypes;
    for (let j = first; j < this.nAtoms; j++) {
      let dx = w[3 * j] - xi, dy = w[3 * j + 1] - yi, dz = w[3 * j + 2] - zi;
      if (dx > hx) dx -= lx;
      else if (dx < -hx) dx += lx;
      if (dy > hy) dy -= ly;
      else if (dy < -hy) dy += ly;
      if (dz > hz) dz -= lz;
      else if (dz < -hz) dz += lz;
      const r2 = dx * dx + dy * dy + dz * dz;
      if (r2 >= rMax2) continue;
      const slot = slots[row + types[j]];
      if (slot < 0) continue;
      const bin = Math.floor(Math.sqrt(r2) * binsPerA);
      hist[slot * nB + (bin < last ? bin : last)] += 1;
    }
  }

  /** Counts atom i against a cell's linked list starting at first. */
  private countList(i: number, first: number, next: Int32Array, hist: Float64Array): void {
    const w = this.wrapped, types = this.types, slots = this.pairSlot;
    const nB = this.nBins, last = nB - 1;
    const lx = this.lx, ly = this.ly, lz = this.lz, hx = this.hx, hy = this.hy, hz = this.hz;
    const rMax2 = this.rMax2, binsPerA = this.binsPerA;
    const xi = w[3 * i], yi = w[3 * i + 1], zi = w[3 * i + 2];
    const row = types[i] * this.nTypes;
    for (let j = first; j >= 0; j = next[j]) {
      let dx = w[3 * j] - xi, dy = w[3 * j + 1] - yi, dz = w[3 * j + 2] - zi;
      if (dx > hx) dx -= lx;
      else if (dx < -hx) dx += lx;
      if (dy > hy) dy -= ly;
      else if (dy < -hy) dy += ly;
      if (dz > hz) dz -= lz;
      else if (dz < -hz) dz += lz;
      const r2 = dx * dx + dy * dy + dz * dz;
      if (r2 >= rMax2) continue;
      const slot = slots[row + types[j]];
      if (slot < 0) continue;
      const bin = Math.floor(Math.sqrt(r2) * binsPerA);
      hist[slot * nB + (bin < last ? bin : last)] += 1;
    }
  }
}

/** Most cells per atom a frame is cut into: wider cells stay correct, and the lists stay O(N) in memory for a thin r_max in a wide box. */
export const MAX_CELLS_PER_ATOM = 2;

/**
 * Cells per side: ⌊L/r_max⌋ (at least one), so no cell is narrower than
 * r_max, with fewer, wider cells when that would exceed MAX_CELLS_PER_ATOM
 * per atom.
 */
export function cellCounts(box: readonly [number, number, number], rMax: number, nAtoms: number): [number, number, number] {
  const n = box.map((l) => Math.max(1, Math.floor(l / rMax))) as [number, number, number];
  const most = Math.max(27, MAX_CELLS_PER_ATOM * nAtoms);
  while (n[0] * n[1] * n[2] > most) {
    // Coarsen the finest side first, by the factor still to go (at least one cell).
    const k = n.indexOf(Math.max(...n));
    const factor = Math.cbrt((n[0] * n[1] * n[2]) / most);
    n[k] = Math.max(1, Math.min(n[k] - 1, Math.floor(n[k] / factor)));
  }
  return n;
}

const OFFSETS_BY_COUNT: readonly (readonly number[])[] = [[], [0], [0, 1]];
const OFFSETS_MANY = [-1, 0, 1] as const;

/** The offsets −1, 0, +1 that name distinct cells along a side of n cells (n = 2: −1 and +1 are one cell). */
function distinctOffsets(n: number): readonly number[] {
  return n >= 3 ? OFFSETS_MANY : OFFSETS_BY_COUNT[n]!;
}

function wrap(x: number, l: number): number {
  const s = x - l * Math.floor(x / l);
  return s >= l ? s - l : s;
}
