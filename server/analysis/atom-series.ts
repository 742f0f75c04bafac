/**
 * Per-atom time series, one atom at a time, so memory stays at a few
 * Float64 buffers of the frame count whatever the atom count.
 *
 * Unwrapping accumulates each frame-to-frame displacement after reducing it
 * to the minimum image of the *current* frame's cell. Under constant
 * pressure this keeps the true displacement (the box breathing does not
 * enter), which is the scheme recommended by von Bülow, Bullerjahn & Hummer,
 * J. Chem. Phys. 153, 021101 (2020) [from memory]. It requires that no atom
 * moves more than half a cell width between stored frames. Along a
 * direction that does not repeat (a slab's normal) positions are taken as
 * they are: nothing crosses a wall.
 */
import { cellFramesOf, minimumImage, type CellFrames } from './cell-geometry.ts';
import { AtomCursor, checkCoordinateShape, FrameCursor, type CoordinateKind } from './coordinate-blocks.ts';
import type { Trajectory } from './trajectory.ts';

export class AtomSeriesReader {
  readonly nFrames: number;
  readonly geometry: CellFrames | null;
  private readonly removeComDrift: boolean;
  /** COM trajectories (component-major, 3·nFrames), each worked out when first needed: VACF and VDOS from stored velocities never need the positions'. */
  private comPositionsMemo: Float64Array | null = null;
  private comVelocitiesMemo: Float64Array | null = null;
  private readonly d = new Float64Array(3);
  private readonly positionCursor: AtomCursor;
  private readonly velocityCursor: AtomCursor | null;

  constructor(
    private readonly traj: Trajectory,
    private readonly masses: Float64Array,
    removeComDrift: boolean,
  ) {
    this.nFrames = traj.nFrames;
    this.geometry = cellFramesOf(traj);
    checkCoordinateShape(traj);
    this.positionCursor = new AtomCursor(traj, 'positions');
    this.velocityCursor = traj.velocities ? new AtomCursor(traj, 'velocities') : null;
    this.removeComDrift = removeComDrift;
  }

  /** COM trajectory subtracted from positions, or null when drift removal is off. */
  get comPositions(): Float64Array | null {
    if (!this.removeComDrift) return null;
    return (this.comPositionsMemo ??= this.massWeightedMean('positions'));
  }

  private get comVelocities(): Float64Array | null {
    if (!this.removeComDrift || !this.traj.velocities) return null;
    return (this.comVelocitiesMemo ??= this.massWeightedMean('velocities'));
  }

  get unwraps(): boolean {
    return this.geometry !== null;
  }

  get hasVelocities(): boolean {
    return this.traj.velocities !== undefined;
  }

  /** Unwrapped positions of one atom, component-major: out[c·T + t], COM removed when asked. */
  unwrapped(atom: number, out: Float64Array): Float64Array {
    this.rawUnwrapped(atom, out, this.comPositions);
    return out;
  }

  /** Frames covered by velocity series: all of them from stored velocities, else the interior frames. */
  get velocityLength(): number {
    return this.traj.velocities ? this.nFrames : Math.max(0, this.nFrames - 2);
  }

  /**
   * Velocities of one atom, component-major out[c·L + t] with L = velocityLength,
   * from the file or from central differences of unwrapped positions.
   */
  velocities(atom: number, out: Float64Array, dtPs: number, scratch: Float64Array): Float64Array {
    if (this.traj.velocities) {
      this.rawVelocities(atom, out, this.comVelocities);
      return out;
    }
    this.unwrapped(atom, scratch);
    const T = this.nFrames;
    const L = T - 2;
    const inv = 1 / (2 * dtPs);
    for (let c = 0; c < 3; c++) {
      for (let t = 0; t < L; t++) out[c * L + t] = (scratch[c * T + t + 2] - scratch[c * T + t]) * inv;
    }
    return out;
  }

  /** Stored velocities of one atom, component-major, with the COM velocity subtracted in the same pass when given. */
  private rawVelocities(atom: number, out: Float64Array, com: Float64Array | null): void {
    const { data: v, base: p0, stride } = this.velocityCursor!.at(atom);
    const T = this.nFrames;
    for (let c = 0; c < 3; c++) {
      let p = p0 + c;
      const base = c * T;
      if (com) for (let t = 0; t < T; t++, p += stride) out[base + t] = v[p] - com[base + t];
      else for (let t = 0; t < T; t++, p += stride) out[base + t] = v[p];
    }
  }

  /**
   * Unwrapped positions of one atom, component-major, with the COM position
   * subtracted in the same pass when given. The running sums are kept apart
   * from the output so each value is the unwrapped position minus the COM,
   * exactly as subtracting afterwards would give.
   */
  private rawUnwrapped(atom: number, out: Float64Array, com: Float64Array | null): void {
    const { data: x, base: p0, stride } = this.positionCursor.at(atom);
    const T = this.nFrames;
    const geom = this.geometry;
    if (!geom) {
      for (let c = 0; c < 3; c++) {
        let p = p0 + c;
        const base = c * T;
        if (com) for (let t = 0; t < T; t++, p += stride) out[base + t] = x[p] - com[base + t];
        else for (let t = 0; t < T; t++, p += stride) out[base + t] = x[p];
      }
      return;
    }
    const H = geom.cells;
    const [px, py, pz] = geom.periodic;
    const d = this.d;
    let ux = x[p0], uy = x[p0 + 1], uz = x[p0 + 2];
    out[0] = com ? ux - com[0] : ux;
    out[T] = com ? uy - com[T] : uy;
    out[2 * T] = com ? uz - com[2 * T] : uz;
    let prev = p0;
    for (let t = 1; t < T; t++) {
      const p = prev + stride;
      let dx = x[p] - x[prev];
      let dy = x[p + 1] - x[prev + 1];
      let dz = x[p + 2] - x[prev + 2];
      if (geom.orthorhombic) {
        const o = 9 * t;
        const lx = H[o], ly = H[o + 4], lz = H[o + 8];
        if (px) dx = nearestImage(dx, lx);
        if (py) dy = nearestImage(dy, ly);
        if (pz) dz = nearestImage(dz, lz);
      } else {
        d[0] = dx;
        d[1] = dy;
        d[2] = dz;
        minimumImage(geom, t, d);
        dx = d[0];
        dy = d[1];
        dz = d[2];
      }
      ux += dx;
      uy += dy;
      uz += dz;
      if (com) {
        out[t] = ux - com[t];
        out[T + t] = uy - com[T + t];
        out[2 * T + t] = uz - com[2 * T + t];
      } else {
        out[t] = ux;
        out[T + t] = uy;
        out[2 * T + t] = uz;
      }
      prev = p;
    }
  }

  /**
   * Mass-weighted mean over every atom of the unwrapped positions (or the
   * velocities), component-major out[c·T + t]. Computed frame by frame,
   * one sequential pass, with each atom unwrapped step by step exactly as
   * rawUnwrapped does and atoms summed in index order, so it equals the
   * per-atom sum to the last bit.
   */
  private massWeightedMean(kind: CoordinateKind): Float64Array {
    const T = this.nFrames, N = this.traj.nAtoms;
    const sum = new Float64Array(3 * T);
    const cursor = new FrameCursor(this.traj, kind);
    let total = 0;
    for (let i = 0; i < N; i++) total += this.masses[i];
    const geom = kind === 'positions' ? this.geometry : null;
    const H = geom?.cells;
    const [px, py, pz] = geom?.periodic ?? [false, false, false];
    const u = new Float64Array(3 * N);
    const d = this.d;
    let previous: { data: Float32Array; offset: number } | null = null;
    for (let t = 0; t < T; t++) {
      const here = cursor.frame(t);
      const x = here.data, o = here.offset;
      if (!geom) {
        // Nothing to unwrap: the frame's own values are summed, no copy needed.
        let sx = 0, sy = 0, sz = 0;
        for (let i = 0; i < N; i++) {
          const m = this.masses[i], p = o + 3 * i;
          sx += m * x[p];
          sy += m * x[p + 1];
          sz += m * x[p + 2];
        }
        sum[t] = sx / total;
        sum[T + t] = sy / total;
        sum[2 * T + t] = sz / total;
        continue;
      }
      if (!previous) {
        for (let k = 0; k < 3 * N; k++) u[k] = x[o + k];
      } else {
        const y = previous.data, q = previous.offset;
        const h = 9 * t;
        for (let i = 0; i < N; i++) {
          const p = o + 3 * i, r = q + 3 * i;
          let dx = x[p] - y[r];
          let dy = x[p + 1] - y[r + 1];
          let dz = x[p + 2] - y[r + 2];
          if (geom.orthorhombic) {
            const lx = H![h], ly = H![h + 4], lz = H![h + 8];
            if (px) dx = nearestImage(dx, lx);
            if (py) dy = nearestImage(dy, ly);
            if (pz) dz = nearestImage(dz, lz);
          } else {
            d[0] = dx;
            d[1] = dy;
            d[2] = dz;
            minimumImage(geom, t, d);
            dx = d[0];
            dy = d[1];
            dz = d[2];
          }
          u[3 * i] += dx;
          u[3 * i + 1] += dy;
          u[3 * i + 2] += dz;
        }
      }
      let sx = 0, sy = 0, sz = 0;
      for (let i = 0; i < N; i++) {
        const m = this.masses[i];
        sx += m * u[3 * i];
        sy += m * u[3 * i + 1];
        sz += m * u[3 * i + 2];
      }
      sum[t] = sx / total;
      sum[T + t] = sy / total;
      sum[2 * T + t] = sz / total;
      previous = here;
    }
    return sum;
  }
}

/**
 * d − l·round(d/l), the step to the nearest image along one orthorhombic
 * axis. Steps between stored frames are almost always well inside half a
 * cell, where the rounding gives ±0 and d comes back unchanged (a zero as
 * +0, as the subtraction would give): the division is skipped there.
 */
function nearestImage(d: number, l: number): number {
  if (d < 0.49 * l && d > -0.49 * l) return d === 0 ? 0 : d;
  return d - l * Math.round(d / l);
}
