/**
 * Potential energy and virial of one frame under a pair interaction model,
 * by cell lists: O(N) per frame at fixed density, for any periodic cell
 * (orthorhombic or triclinic) and for open boundaries.
 *
 * Periodic cells are cut into n_a × n_b × n_c sub-cells along the lattice
 * vectors, each at least as wide (perpendicular to its faces) as needed, and
 * neighbour sub-cells are searched up to m_k = ⌈rc·n_k/w_k⌉ away, where w_k is
 * the cell's perpendicular width. Every periodic image within the cut-off is
 * counted (not only the nearest), so the truncated lattice sum is exact even
 * when the cut-off exceeds half the cell; each unordered pair-image is met
 * once by scanning only the half-space of sub-cell offsets.
 *
 * Works frame by frame (positions of one frame and its cell), so callers can
 * stream frames from any store.
 */
import { resolvePairsFor, type InteractionModel, type ResolvedPair } from '../../shared/interaction-model.ts';
import { forceShiftOf, pairEvaluator, shiftOf, tailIntegral, type PairEvaluator } from '../../shared/pair-functions.ts';

const FORM_LJ = 0, FORM_OTHER = 1, FORM_NONE = 2;

/** The model prepared for one set of species: per type-pair tables for the inner loop. */
export interface CompiledModel {
  pairs: ResolvedPair[];
  species: string[];
  /** Species label → type index. */
  typeIndex: Map<string, number>;
  nTypes: number;
  form: Int8Array;
  rc2: Float64Array;
  shift: Float64Array;
  /** U′(rc) for force-shifted pairs (else 0) and rc. */
  slope: Float64Array;
  rc: Float64Array;
  /** LJ: σ², 4ε, 24ε. */
  s2: Float64Array;
  e4: Float64Array;
  e24: Float64Array;
  evaluators: (PairEvaluator | null)[];
  maxCutoffA: number;
  /** Per type pair: ∫_rc^∞ r²U dr (eV·Å³) and rc³U(rc) (eV·Å³), for tail corrections; 0 where none asked. */
  tailU: Float64Array;
  tailP: Float64Array;
}

export function compileModel(model: InteractionModel, species: readonly string[]): CompiledModel {
  const pairs = resolvePairsFor(model, species);
  const kinds = [...new Set(species)].sort();
  const typeIndex = new Map(kinds.map((s, i) => [s, i]));
  const nT = kinds.length, nP = nT * nT;
  const c: CompiledModel = {
    pairs, species: kinds, typeIndex, nTypes: nT,
    form: new Int8Array(nP).fill(FORM_NONE), rc2: new Float64Array(nP), shift: new Float64Array(nP), slope: new Float64Array(nP), rc: new Float64Array(nP),
    s2: new Float64Array(nP), e4: new Float64Array(nP), e24: new Float64Array(nP), evaluators: new Array<PairEvaluator | null>(nP).fill(null),
    maxCutoffA: 0, tailU: new Float64Array(nP), tailP: new Float64Array(nP),
  };
  const out = new Float64Array(2);
  for (const p of pairs) {
    const a = typeIndex.get(p.species[0])!, b = typeIndex.get(p.species[1])!;
    for (const k of a === b ? [a * nT + a] : [a * nT + b, b * nT + a]) {
      if (p.form === 'none') continue;
      c.form[k] = p.form === 'lj' ? FORM_LJ : FORM_OTHER;
      c.rc2[k] = p.cutoffA * p.cutoffA;
      c.shift[k] = shiftOf(p);
      c.slope[k] = forceShiftOf(p);
      c.rc[k] = p.cutoffA;
      if (p.form === 'lj') {
        c.s2[k] = p.sigmaA * p.sigmaA;
        c.e4[k] = 4 * p.epsilonEV;
        c.e24[k] = 24 * p.epsilonEV;
      } else c.evaluators[k] = pairEvaluator(p);
      if (p.tailCorrection) {
        c.tailU[k] = tailIntegral(p);
        pairEvaluator(p)(p.cutoffA, out);
        c.tailP[k] = p.cutoffA ** 3 * out[0];
      }
    }
    if (p.form !== 'none') c.maxCutoffA = Math.max(c.maxCutoffA, p.cutoffA);
  }
  return c;
}

export interface FrameEnergy {
  /** Pair energy inside the cut-offs (shifted where asked), eV. */
  pairEV: number;
  /** Analytic tail energy, eV (0 without tail corrections). */
  tailEV: number;
  /** Virial tensor Σ r_ij ⊗ F_ij over pairs, eV: xx, yy, zz, xy, xz, yz. */
  virialEV: Float64Array;
  /** Tail pressure, eV/Å³ (isotropic). */
  tailPressureEVPerA3: number;
  /** Cell volume, Å³, or NaN without a periodic cell. */
  volumeA3: number;
  /** Pairs found inside their cut-off. */
  pairs: number;
}

/** Evaluates frames of one system; keeps its buffers between frames. */
export class FrameEnergyEvaluator {
  readonly types: Int32Array;
  private readonly counts: Float64Array;
  private order = new Int32Array(0);
  private cellOf = new Int32Array(0);
  private start = new Int32Array(0);
  private xs: Float64Array;
  private ys: Float64Array;
  private zs: Float64Array;
  /** The arrays sortByCell reorders xs, ys, zs into. */
  private spareX: Float64Array;
  private spareY: Float64Array;
  private spareZ: Float64Array;
  private fill = new Int32Array(0);
  private readonly ts: Int32Array;
  private readonly scratch = new Float64Array(2);

  constructor(readonly model: CompiledModel, species: readonly string[]) {
    const n = species.length;
    this.types = Int32Array.from(species, (s) => {
      const t = model.typeIndex.get(s);
      if (t === undefined) throw new Error(`species ${s} is not in the compiled model`);
      return t;
    });
    this.counts = new Float64Array(model.nTypes);
    for (const t of this.types) this.counts[t]++;
    this.order = new Int32Array(n);
    this.cellOf = new Int32Array(n);
    this.xs = new Float64Array(n);
    this.ys = new Float64Array(n);
    this.zs = new Float64Array(n);
    this.spareX = new Float64Array(n);
    this.spareY = new Float64Array(n);
    this.spareZ = new Float64Array(n);
    this.ts = new Int32Array(n);
  }

  /**
   * One frame: `positions` holds x, y, z per atom from `offset` (Å); `cell`
   * holds the lattice rows from `cellOffset` (Å), or is null for open
   * boundaries (no images, no volume, no tail).
   */
  evaluate(positions: ArrayLike<number>, offset: number, cell: ArrayLike<number> | null, cellOffset = 0, periodic: readonly boolean[] = [true, true, true]): FrameEnergy {
    // A slab or wire: images only along the directions that repeat, and no volume, pressure or tail (the system does not fill the cell).
    const whole = periodic.every(Boolean);
    const n = this.types.length;
    const result: FrameEnergy = { pairEV: 0, tailEV: 0, virialEV: new Float64Array(6), tailPressureEVPerA3: 0, volumeA3: NaN, pairs: 0 };
    const rc = this.model.maxCutoffA;
    if (n < 1 || !(rc > 0)) {
      if (cell && whole) result.volumeA3 = volumeOf(cell, cellOffset);
      return result;
    }
    const grid = cell ? this.binPeriodic(positions, offset, cell, cellOffset, rc, periodic) : this.binOpen(positions, offset, rc);
    this.sweep(grid, result);
    if (cell && whole) {
      const V = grid.volume;
      result.volumeA3 = V;
      this.addTails(V, result);
    }
    return result;
  }

  private addTails(V: number, result: FrameEnergy): void {
    const m = this.model, nT = m.nTypes;
    let u = 0, p = 0;
    for (let a = 0; a < nT; a++)
      for (let b = 0; b < nT; b++) {
        const k = a * nT + b;
        if (m.tailU[k] === 0 && m.tailP[k] === 0) continue;
        const nn = this.counts[a] * this.counts[b];
        u += nn * m.tailU[k];
        p += nn * (m.tailP[k] + 3 * m.tailU[k]);
      }
    // U_tail = (2π/V) Σ_ab N_a N_b ∫ r²u;  P_tail = (2π/3V²) Σ_ab N_a N_b [rc³u(rc) + 3∫ r²u]  (ordered pairs a, b).
    result.tailEV = (2 * Math.PI * u) / V;
    result.tailPressureEVPerA3 = (2 * Math.PI * p) / (3 * V * V);
  }

  private binPeriodic(x: ArrayLike<number>, off: number, H: ArrayLike<number>, o: number, rc: number, wrap: readonly boolean[]): Grid {
    const n = this.types.length;
    const a0 = H[o], a1 = H[o + 1], a2 = H[o + 2], b0 = H[o + 3], b1 = H[o + 4], b2 = H[o + 5], c0 = H[o + 6], c1 = H[o + 7], c2 = H[o + 8];
    // Cross products give the reciprocal rows and the perpendicular widths.
    const bc0 = b1 * c2 - b2 * c1, bc1 = b2 * c0 - b0 * c2, bc2 = b0 * c1 - b1 * c0;
    const ca0 = c1 * a2 - c2 * a1, ca1 = c2 * a0 - c0 * a2, ca2 = c0 * a1 - c1 * a0;
    const ab0 = a1 * b2 - a2 * b1, ab1 = a2 * b0 - a0 * b2, ab2 = a0 * b1 - a1 * b0;
    const det = a0 * bc0 + a1 * bc1 + a2 * bc2;
    if (!(Math.abs(det) > 0) || !Number.isFinite(det)) throw new Error('the periodic cell is singular');
    const V = Math.abs(det);
    const cellWidths = [V / Math.hypot(bc0, bc1, bc2), V / Math.hypot(ca0, ca1, ca2), V / Math.hypot(ab0, ab1, ab2)];
    const inv = 1 / det;
    const fractional = (i: number, k: number): number => {
      const px = x[off + 3 * i], py = x[off + 3 * i + 1], pz = x[off + 3 * i + 2];
      return k === 0 ? (px * bc0 + py * bc1 + pz * bc2) * inv : k === 1 ? (px * ca0 + py * ca1 + pz * ca2) * inv : (px * ab0 + py * ab1 + pz * ab2) * inv;
    };
    // Along a direction that does not repeat, the grid spans the atoms' own extent (fractional lo..lo+span), unwrapped.
    const lo = [0, 0, 0], span = [1, 1, 1];
    for (let k = 0; k < 3; k++) {
      if (wrap[k]) continue;
      let min = Infinity, max = -Infinity;
      for (let i = 0; i < n; i++) {
        const v = fractional(i, k);
        if (v < min) min = v;
        if (v > max) max = v;
      }
      lo[k] = min;
      span[k] = Math.max(max - min, 1e-9);
    }
    const widths = cellWidths.map((w, k) => w * span[k]!);
    const dims = subdivide(widths, rc, n);
    const [nx, ny, nz] = dims;
    const cellOf = this.cellOf;
    const place = (v: number, k: number): number => (wrap[k] ? v - Math.floor(v) : (v - lo[k]!) / span[k]!);
    for (let i = 0; i < n; i++) {
      let s0 = fractional(i, 0), s1 = fractional(i, 1), s2 = fractional(i, 2);
      if (!Number.isFinite(s0 + s1 + s2)) throw new Error(`atom ${i + 1} has a position that is not a finite number`);
      const u0 = place(s0, 0), u1 = place(s1, 1), u2 = place(s2, 2);
      if (wrap[0]) s0 = u0;
      if (wrap[1]) s1 = u1;
      if (wrap[2]) s2 = u2;
      const ix = Math.min(nx - 1, Math.floor(u0 * nx)), iy = Math.min(ny - 1, Math.floor(u1 * ny)), iz = Math.min(nz - 1, Math.floor(u2 * nz));
      cellOf[i] = (iz * ny + iy) * nx + ix;
      // Wrapped Cartesian position r = s·H.
      this.xs[i] = s0 * a0 + s1 * b0 + s2 * c0;
      this.ys[i] = s0 * a1 + s1 * b1 + s2 * c1;
      this.zs[i] = s0 * a2 + s1 * b2 + s2 * c2;
    }
    this.sortByCell(dims[0] * dims[1] * dims[2]);
    // Along a direction that does not repeat there is nothing beyond the grid's own cells (a flat layer has one).
    const reach = widths.map((w, k) => {
      const r = Math.max(1, Math.ceil((rc * dims[k]) / w - 1e-12));
      return wrap[k] ? r : Math.min(r, dims[k] - 1);
    }) as [number, number, number];
    const rectangular = a1 === 0 && a2 === 0 && b0 === 0 && b2 === 0 && c0 === 0 && c1 === 0;
    return {
      dims, reach, periodic: true, wrap: [wrap[0]!, wrap[1]!, wrap[2]!], lattice: [a0, a1, a2, b0, b1, b2, c0, c1, c2], volume: V,
      binWidths: rectangular ? widths.map((w, k) => w / dims[k]) as [number, number, number] : null,
    };
  }

  private binOpen(x: ArrayLike<number>, off: number, rc: number): Grid {
    const n = this.types.length;
    const lo = [Infinity, Infinity, Infinity], hi = [-Infinity, -Infinity, -Infinity];
    for (let i = 0; i < n; i++)
      for (let k = 0; k < 3; k++) {
        const v = x[off + 3 * i + k];
        if (!Number.isFinite(v)) throw new Error(`atom ${i + 1} has a position that is not a finite number`);
        if (v < lo[k]) lo[k] = v;
        if (v > hi[k]) hi[k] = v;
      }
    const span = hi.map((h, k) => Math.max(h - lo[k], 1e-9));
    const dims = subdivide(span, rc, n);
    for (let i = 0; i < n; i++) {
      const ix = Math.min(dims[0] - 1, Math.floor(((x[off + 3 * i] - lo[0]) / span[0]) * dims[0]));
      const iy = Math.min(dims[1] - 1, Math.floor(((x[off + 3 * i + 1] - lo[1]) / span[1]) * dims[1]));
      const iz = Math.min(dims[2] - 1, Math.floor(((x[off + 3 * i + 2] - lo[2]) / span[2]) * dims[2]));
      this.cellOf[i] = (iz * dims[1] + iy) * dims[0] + ix;
      this.xs[i] = x[off + 3 * i];
      this.ys[i] = x[off + 3 * i + 1];
      this.zs[i] = x[off + 3 * i + 2];
    }
    this.sortByCell(dims[0] * dims[1] * dims[2]);
    // Nothing lies beyond the grid: a flat or thin system needs no more than its own cells.
    const reach = span.map((w, k) => Math.min(dims[k] - 1, Math.max(1, Math.ceil((rc * dims[k]) / w - 1e-12)))) as [number, number, number];
    return {
      dims, reach, periodic: false, wrap: [false, false, false], lattice: [0, 0, 0, 0, 0, 0, 0, 0, 0], volume: NaN,
      binWidths: span.map((w, k) => w / dims[k]) as [number, number, number],
    };
  }

  /** Counting sort of atoms by sub-cell, so each sub-cell's atoms lie together in xs/ys/zs/ts. */
  private sortByCell(nCells: number): void {
    const n = this.types.length;
    if (this.start.length < nCells + 1) this.start = new Int32Array(nCells + 1);
    const start = this.start;
    start.fill(0, 0, nCells + 1);
    for (let i = 0; i < n; i++) start[this.cellOf[i] + 1]++;
    for (let c = 0; c < nCells; c++) start[c + 1] += start[c];
    if (this.fill.length < nCells) this.fill = new Int32Array(nCells);
    const fill = this.fill, order = this.order, cellOf = this.cellOf;
    fill.set(start.subarray(0, nCells));
    for (let i = 0; i < n; i++) order[fill[cellOf[i]]++] = i;
    // Reordered through the spare arrays, which then swap roles: nothing is allocated frame after frame.
    const xs = this.xs, ys = this.ys, zs = this.zs, x = this.spareX, y = this.spareY, z = this.spareZ;
    for (let k = 0; k < n; k++) {
      const i = order[k];
      x[k] = xs[i];
      y[k] = ys[i];
      z[k] = zs[i];
      this.ts[k] = this.types[i];
    }
    this.xs = x, this.ys = y, this.zs = z;
    this.spareX = xs, this.spareY = ys, this.spareZ = zs;
  }

  /** Energy, six virial components and the pair count, accumulated by pairBlock. */
  private readonly acc = new Float64Array(8);

  private sweep(g: Grid, r: FrameEnergy): void {
    const [nx, ny, nz] = g.dims;
    const L = g.lattice;
    const [wx, wy, wz] = g.wrap;
    const start = this.start;
    this.acc.fill(0);
    const rows = this.neighbourRows(g);

    for (let cz = 0; cz < nz; cz++)
      for (let cy = 0; cy < ny; cy++)
        for (let cx = 0; cx < nx; cx++) {
          const c = (cz * ny + cy) * nx + cx;
          const i0 = start[c], i1 = start[c + 1];
          if (i0 === i1) continue;
          this.pairBlock(i0, i1, i0, i1, true, 0, 0, 0);
          for (let k = 0; k < rows.length; k += 4) {
            let ty = cy + rows[k + 2], tz = cz + rows[k + 3];
            let shy = 0, shz = 0, sy = 0, sz = 0;
            // A neighbour row beyond the grid along a direction that does not repeat is empty space.
            if (g.periodic && wy) {
              sy = Math.floor(ty / ny);
              ty -= sy * ny;
            } else if (ty < 0 || ty >= ny) continue;
            if (g.periodic && wz) {
              sz = Math.floor(tz / nz);
              tz -= sz * nz;
            } else if (tz < 0 || tz >= nz) continue;
            if (g.periodic) {
              shy = sy * L[4] + sz * L[7];
              shz = sy * L[5] + sz * L[8];
            }
            const row = (tz * ny + ty) * nx;
            // The row's sub-cells cx + from … cx + to lie side by side in memory, and so do their atoms:
            // one block per stretch that shares an image (two where the row wraps around).
            let tx = cx + rows[k];
            const last = cx + rows[k + 1];
            while (tx <= last) {
              let sx = 0;
              if (g.periodic && wx) sx = Math.floor(tx / nx);
              else if (tx < 0) {
                tx = 0;
                continue;
              } else if (tx >= nx) break;
              const from = tx - sx * nx;
              const to = Math.min(nx - 1, last - sx * nx);
              const j0 = start[row + from], j1 = start[row + to + 1];
              if (j0 !== j1) {
                const shx = g.periodic ? sx * L[0] + sy * L[3] + sz * L[6] : 0;
                const imageY = g.periodic ? sx * L[1] + shy : 0;
                const imageZ = g.periodic ? sx * L[2] + shz : 0;
                this.pairBlock(i0, i1, j0, j1, false, shx, imageY, imageZ);
              }
              tx += to - from + 1;
            }
          }
        }
    const a = this.acc;
    r.pairEV = a[0];
    r.virialEV.set(a.subarray(1, 7));
    r.pairs = a[7];
  }

  /**
   * The half-space of neighbour sub-cell offsets as rows along x: from, to, oy, oz
   * per row ((0,0,0) itself is handled with j > i; of o and −o only one is met).
   * With rectangular sub-cells each row stops where its nearest corners are a
   * cut-off or more apart, so the searched region hugs the cut-off sphere.
   */
  private neighbourRows(g: Grid): number[] {
    const [mx, my, mz] = g.reach;
    const bins = g.binWidths;
    const rc = this.model.maxCutoffA;
    const beyond = rc * rc * (1 + 1e-9);
    const gap = (o: number, k: number): number => (Math.abs(o) <= 1 ? 0 : (Math.abs(o) - 1) * bins![k]);
    const rows: number[] = [];
    for (let oz = 0; oz <= mz; oz++)
      for (let oy = oz === 0 ? 0 : -my; oy <= my; oy++) {
        let from = oz === 0 && oy === 0 ? 1 : -mx, to = mx;
        if (bins) {
          const rest = gap(oy, 1) ** 2 + gap(oz, 2) ** 2;
          if (rest >= beyond) continue;
          while (to >= from && to > 1 && gap(to, 0) ** 2 + rest >= beyond) to--;
          while (from < -1 && gap(from, 0) ** 2 + rest >= beyond) from++;
        }
        if (from <= to) rows.push(from, to, oy, oz);
      }
    return rows;
  }

  /** All pairs between atoms i0..i1 and j0..j1 (j > i when self), with atom j displaced by the image shift. */
  private pairBlock(i0: number, i1: number, j0: number, j1: number, self: boolean, shx: number, shy: number, shz: number): void {
    const m = this.model, nT = m.nTypes;
    const form = m.form, rc2 = m.rc2, shift = m.shift, slope = m.slope, rcs = m.rc, S2 = m.s2, E4 = m.e4, E24 = m.e24, ev = m.evaluators;
    const xs = this.xs, ys = this.ys, zs = this.zs, ts = this.ts, out = this.scratch, acc = this.acc;
    const rcMax2 = m.maxCutoffA * m.maxCutoffA;
    let energy = 0, wxx = 0, wyy = 0, wzz = 0, wxy = 0, wxz = 0, wyz = 0, count = 0;
    for (let i = i0; i < i1; i++) {
      // d = r_i − (r_j + shift)
      const xi = xs[i] - shx, yi = ys[i] - shy, zi = zs[i] - shz;
      const ti = ts[i] * nT;
      for (let j = self ? i + 1 : j0; j < j1; j++) {
        const dx = xi - xs[j], dy = yi - ys[j], dz = zi - zs[j];
        const r2 = dx * dx + dy * dy + dz * dz;
        if (r2 >= rcMax2) continue;
        const tp = ti + ts[j];
        if (r2 >= rc2[tp]) continue;
        const f = form[tp];
        let u = 0, fOverR = 0;
        if (f === FORM_LJ) {
          const sr2 = S2[tp] / r2;
          const sr6 = sr2 * sr2 * sr2;
          u = E4[tp] * (sr6 * sr6 - sr6);
          fOverR = (E24[tp] * (2 * sr6 * sr6 - sr6)) / r2;
        } else if (f === FORM_OTHER) {
          const rr = Math.sqrt(r2);
          (ev[tp] as PairEvaluator)(rr, out);
          u = out[0];
          fOverR = -out[1] / rr;
        } else continue;
        u -= shift[tp];
        const sl = slope[tp];
        if (sl !== 0) {
          const rr = Math.sqrt(r2);
          u -= (rr - rcs[tp]) * sl;
          fOverR += sl / rr;
        }
        energy += u;
        wxx += fOverR * dx * dx;
        wyy += fOverR * dy * dy;
        wzz += fOverR * dz * dz;
        wxy += fOverR * dx * dy;
        wxz += fOverR * dx * dz;
        wyz += fOverR * dy * dz;
        count++;
      }
    }
    acc[0] += energy;
    acc[1] += wxx;
    acc[2] += wyy;
    acc[3] += wzz;
    acc[4] += wxy;
    acc[5] += wxz;
    acc[6] += wyz;
    acc[7] += count;
  }
}

interface Grid {
  dims: [number, number, number];
  reach: [number, number, number];
  periodic: boolean;
  /** Directions along which neighbour cells wrap around (all three for bulk, two for a slab). */
  wrap: [boolean, boolean, boolean];
  lattice: number[];
  volume: number;
  /** Sub-cell edge lengths when the sub-cells are rectangular boxes (else null): for leaving out sub-cells beyond the cut-off. */
  binWidths: [number, number, number] | null;
}

/**
 * Sub-cells per direction, about rc/SUBDIVISION wide: with the rows of
 * neighbours trimmed to the cut-off sphere (neighbourRows), half-width
 * sub-cells search about half the volume rc-wide ones do, for little more
 * bookkeeping since each row is one run of atoms. Capped near 2N in total
 * so sparse boxes stay cheap.
 */
const SUBDIVISION = 2;
function subdivide(widths: number[], rc: number, n: number): [number, number, number] {
  const dims = widths.map((w) => Math.max(1, Math.floor((SUBDIVISION * w) / rc))) as [number, number, number];
  const cap = 2 * n + 27;
  while (dims[0] * dims[1] * dims[2] > cap) {
    const k = dims.indexOf(Math.max(...dims));
    dims[k] = Math.max(1, Math.floor(dims[k] / 2));
  }
  return dims;
}

function volumeOf(H: ArrayLike<number>, o: number): number {
  const a = [H[o], H[o + 1], H[o + 2]], b = [H[o + 3], H[o + 4], H[o + 5]], c = [H[o + 6], H[o + 7], H[o + 8]];
  return Math.abs(a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]));
}
