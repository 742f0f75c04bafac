/**
 * Pair-distance histogram of one frame in an orthorhombic periodic cell,
 * minimum image, each unordered pair once, binned by type pair.
 *
 * Large systems use linked cell lists with cells no narrower than r_max and
 * the 13-cell half stencil, so the work per frame is O(N·ρ·r_max³) rather
 * than O(N²). The stencil needs three cells per side; when the cell is
 * smaller than 3·r_max, or N is below BRUTE_FORCE_MAX_ATOMS, all pairs are
 * visited instead (then r_max is a sizeable fraction of the box and most
 * pairs are counted anyway).
 */
export const BRUTE_FORCE_MAX_ATOMS = 256;
/** Relative margin below r_max² treated as r_max (single-precision round-off of positions). */
export const R_MAX_ROUNDOFF = 4e-6;

export type PairMethod = 'auto' | 'cell-list' | 'brute-force';

export class PairHistogram {
  private readonly wrapped: Float64Array;
  private readonly next: Int32Array;
  private head = new Int32Array(0);
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
    const nx = Math.floor(lx / this.rMax), ny = Math.floor(ly / this.rMax), nz = Math.floor(lz / this.rMax);
    const cellsPossible = nx >= 3 && ny >= 3 && nz >= 3;
    const useCells = this.method === 'cell-list' ? cellsPossible : this.method === 'auto' && cellsPossible && N > BRUTE_FORCE_MAX_ATOMS;
    if (this.method === 'cell-list' && !cellsPossible) throw new Error('Cell lists need the box to be at least 3·r_max wide.');
    this.lastMethod = useCells ? 'cell-list' : 'brute-force';
    if (useCells) this.cellFrame(nx, ny, nz, hist);
    else this.bruteFrame(hist);
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
    for (let cz = 0; cz < nz; cz++) {
      for (let cy = 0; cy < ny; cy++) {
        for (let cx = 0; cx < nx; cx++) {
          const c = (cz * ny + cy) * nx + cx;
          for (let i = head[c]; i >= 0; i = next[i]) {
            this.countList(i, next[i], next, hist);
            for (let s = 0; s < 13; s++) {
              const ox = HALF_STENCIL[3 * s], oy = HALF_STENCIL[3 * s + 1], oz = HALF_STENCIL[3 * s + 2];
              const c2 = (((cz + oz + nz) % nz) * ny + ((cy + oy + ny) % ny)) * nx + ((cx + ox + nx) % nx);
              this.countList(i, head[c2], next, hist);
            }
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

const HALF_STENCIL = Int32Array.from([
  1, 0, 0, -1, 1, 0, 0, 1, 0, 1, 1, 0,
  -1, -1, 1, 0, -1, 1, 1, -1, 1, -1, 0, 1, 0, 0, 1, 1, 0, 1, -1, 1, 1, 0, 1, 1, 1, 1, 1,
]);

function wrap(x: number, l: number): number {
  const s = x - l * Math.floor(x / l);
  return s >= l ? s - l : s;
}
