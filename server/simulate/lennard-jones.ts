/**
 * A small Lennard-Jones molecular-dynamics engine for demo data and tests:
 * velocity Verlet in a periodic cubic box, truncated and shifted pair
 * potential, Verlet neighbour list (rebuilt when any atom has moved half the
 * skin) built through cell lists, FCC start, Maxwell–Boltzmann velocities
 * from a seeded generator, then optional melting and equilibration stages
 * with per-step velocity rescaling, then NVE production.
 *
 * Units are the engine's (Å, ps, u, K); defaults are argon-like
 * (σ = 3.405 Å, ε/k_B = 119.8 K, m = 39.948 u: Rowley, Nicholson &
 * Parsonage, via the SklogWiki "Argon" page).
 */
import { BOLTZMANN_ENGINE, JOULE_PER_ENGINE_ENERGY, ELEMENTARY_CHARGE_C } from '../analysis/constants.ts';
import type { Trajectory } from '../analysis/trajectory.ts';
import { fccLattice } from './fcc-lattice.ts';
import { SeededRandom } from './random.ts';

export interface LennardJonesOptions {
  /** FCC unit cells per box edge; N = 4·n³. */
  cellsPerSide: number;
  /** ρ* = N·σ³/V. */
  reducedDensity: number;
  temperatureK: number;
  sigmaA?: number;
  epsilonOverKB?: number;
  massU?: number;
  species?: string;
  /** Cut-off in σ (default 2.5). */
  cutoffSigma?: number;
  skinSigma?: number;
  /** Default 0.004·τ. */
  timeStepPs?: number;
  /** Time step of the production stage when it differs from the melting and equilibration stages. */
  productionTimeStepPs?: number;
  /** Optional hot stage to melt the FCC start. */
  meltTemperatureK?: number;
  meltSteps?: number;
  equilibrationSteps: number;
  productionSteps: number;
  sampleEvery: number;
  seed: number;
  /**
   * Also subtract the force at the cut-off (U − U(rc) − (r − rc)·U′(rc)), so
   * force and energy are both continuous there and velocity Verlet shows its
   * clean Δt² energy error.
   */
  forceShifted?: boolean;
  /** Keep rescaling velocities to temperatureK during production (isokinetic sampling instead of NVE). */
  productionRescale?: boolean;
}

export interface LennardJonesRun {
  trajectory: Trajectory;
  /** Per stored frame, eV for the whole system. */
  potentialEV: Float64Array;
  kineticEV: Float64Array;
  boxA: number;
  tauPs: number;
  epsilonEngine: number;
  massU: number;
}

export function simulateLennardJones(o: LennardJonesOptions, onProgress?: (fraction: number) => void): LennardJonesRun {
  const sigma = o.sigmaA ?? 3.405;
  const eps = (o.epsilonOverKB ?? 119.8) * BOLTZMANN_ENGINE;
  const mass = o.massU ?? 39.948;
  const N = 4 * o.cellsPerSide ** 3;
  const box = sigma * Math.cbrt(N / o.reducedDensity);
  const rc = (o.cutoffSigma ?? 2.5) * sigma;
  if (rc > box / 2) throw new Error('The cut-off must not exceed half the box.');
  const skin = (o.skinSigma ?? 0.3) * sigma;
  const tau = sigma * Math.sqrt(mass / eps);
  let dt = o.timeStepPs ?? 0.004 * tau;
  const rng = new SeededRandom(o.seed);

  const x = fccLattice(o.cellsPerSide, box / o.cellsPerSide);
  const v = new Float64Array(3 * N);
  const f = new Float64Array(3 * N);
  for (let i = 0; i < 3 * N; i++) v[i] = rng.normal();
  setTemperature(v, N, mass, o.meltTemperatureK ?? o.temperatureK, true);

  const system = new PairSystem(N, box, rc, skin, sigma, eps, o.forceShifted ?? false);
  system.forces(x, f);
  const invM = 1 / mass;
  const step = (): void => {
    for (let i = 0; i < 3 * N; i++) {
      v[i] += 0.5 * dt * f[i] * invM;
      x[i] += dt * v[i];
    }
    system.forces(x, f);
    for (let i = 0; i < 3 * N; i++) v[i] += 0.5 * dt * f[i] * invM;
  };
  const meltSteps = o.meltTemperatureK !== undefined ? (o.meltSteps ?? 0) : 0;
  const total = meltSteps + o.equilibrationSteps + o.productionSteps;
  let done = 0;
  for (let s = 0; s < meltSteps; s++, done++) {
    step();
    setTemperature(v, N, mass, o.meltTemperatureK as number, false);
  }
  for (let s = 0; s < o.equilibrationSteps; s++, done++) {
    step();
    setTemperature(v, N, mass, o.temperatureK, false);
  }
  if (o.productionTimeStepPs !== undefined) dt = o.productionTimeStepPs;
  const nFrames = Math.floor(o.productionSteps / o.sampleEvery) + 1;
  const positions = new Float32Array(3 * N * nFrames);
  const velocities = new Float32Array(3 * N * nFrames);
  const times = new Float64Array(nFrames);
  const potentialEV = new Float64Array(nFrames), kineticEV = new Float64Array(nFrames);
  const toEV = JOULE_PER_ENGINE_ENERGY / ELEMENTARY_CHARGE_C;
  const store = (frame: number): void => {
    const base = 3 * N * frame;
    let ke = 0;
    for (let i = 0; i < 3 * N; i++) {
      positions[base + i] = x[i] - box * Math.floor(x[i] / box);
      velocities[base + i] = v[i];
      ke += v[i] * v[i];
    }
    kineticEV[frame] = 0.5 * mass * ke * toEV;
    potentialEV[frame] = system.lastPotential * toEV;
    times[frame] = frame * o.sampleEvery * dt;
  };
  store(0);
  for (let s = 1; s <= o.productionSteps; s++, done++) {
    step();
    if (o.productionRescale) setTemperature(v, N, mass, o.temperatureK, false);
    if (s % o.sampleEvery === 0) store(s / o.sampleEvery);
    if ((done & 255) === 0) onProgress?.(done / total);
  }
  const cells = new Float64Array(9 * nFrames);
  for (let fr = 0; fr < nFrames; fr++) (cells[9 * fr] = box), (cells[9 * fr + 4] = box), (cells[9 * fr + 8] = box);
  return {
    trajectory: { nAtoms: N, nFrames, species: new Array<string>(N).fill(o.species ?? 'Ar'), positions, velocities, cells, times, boundary: 'periodic' },
    potentialEV,
    kineticEV,
    boxA: box,
    tauPs: tau,
    epsilonEngine: eps,
    massU: mass,
  };
}

/** Removes net momentum (first call) and rescales to the target temperature with 3N − 3 degrees of freedom. */
function setTemperature(v: Float64Array, N: number, mass: number, targetK: number, removeMomentum: boolean): void {
  if (removeMomentum) {
    for (let c = 0; c < 3; c++) {
      let s = 0;
      for (let i = 0; i < N; i++) s += v[3 * i + c];
      s /= N;
      for (let i = 0; i < N; i++) v[3 * i + c] -= s;
    }
  }
  let ke2 = 0;
  for (let i = 0; i < 3 * N; i++) ke2 += v[i] * v[i];
  const current = (mass * ke2) / ((3 * N - 3) * BOLTZMANN_ENGINE);
  const scale = Math.sqrt(targetK / current);
  for (let i = 0; i < 3 * N; i++) v[i] *= scale;
}

/** Truncated-and-shifted LJ forces over a Verlet list. */
class PairSystem {
  lastPotential = 0;
  private pairI = new Int32Array(0);
  private pairJ = new Int32Array(0);
  private nPairs = 0;
  private readonly reference: Float64Array;
  private readonly shift: number;
  /** U′(rc) when force-shifted, else 0. */
  private readonly slope: number;
  private readonly head: Int32Array;
  private readonly next: Int32Array;
  private readonly cellIndex: Int32Array;
  private readonly nCell: number;

  constructor(
    private readonly N: number,
    private readonly box: number,
    private readonly rc: number,
    private readonly skin: number,
    private readonly sigma: number,
    private readonly eps: number,
    forceShifted: boolean,
  ) {
    this.reference = new Float64Array(3 * N).fill(Infinity);
    const s6 = (sigma / rc) ** 6;
    this.shift = 4 * eps * (s6 * s6 - s6);
    this.slope = forceShifted ? (4 * eps * (-12 * s6 * s6 + 6 * s6)) / rc : 0;
    this.nCell = Math.floor(box / (rc + skin));
    this.head = new Int32Array(Math.max(1, this.nCell ** 3));
    this.next = new Int32Array(N);
    this.cellIndex = new Int32Array(N);
  }

  forces(x: Float64Array, f: Float64Array): void {
    if (this.needsRebuild(x)) this.rebuild(x);
    f.fill(0);
    const L = this.box, half = 0.5 * L;
    const rc2 = this.rc * this.rc, s2 = this.sigma * this.sigma;
    const e4 = 4 * this.eps, e24 = 24 * this.eps, slope = this.slope;
    let pot = 0;
    const pi = this.pairI, pj = this.pairJ;
    for (let p = 0; p < this.nPairs; p++) {
      const i = 3 * pi[p], j = 3 * pj[p];
      let dx = x[i] - x[j], dy = x[i + 1] - x[j + 1], dz = x[i + 2] - x[j + 2];
      // Positions are wrapped at each list rebuild and move less than the
      // skin between rebuilds, so one conditional image shift suffices.
      if (dx > half) dx -= L;
      else if (dx < -half) dx += L;
      if (dy > half) dy -= L;
      else if (dy < -half) dy += L;
      if (dz > half) dz -= L;
      else if (dz < -half) dz += L;
      const r2 = dx * dx + dy * dy + dz * dz;
      if (r2 >= rc2) continue;
      const sr2 = s2 / r2;
      const sr6 = sr2 * sr2 * sr2;
      pot += e4 * (sr6 * sr6 - sr6) - this.shift;
      let fr = (e24 * (2 * sr6 * sr6 - sr6)) / r2;
      if (slope !== 0) {
        const r = Math.sqrt(r2);
        pot -= (r - this.rc) * slope;
        fr += slope / r;
      }
      f[i] += fr * dx;
      f[i + 1] += fr * dy;
      f[i + 2] += fr * dz;
      f[j] -= fr * dx;
      f[j + 1] -= fr * dy;
      f[j + 2] -= fr * dz;
    }
    this.lastPotential = pot;
  }

  private needsRebuild(x: Float64Array): boolean {
    const limit = (0.5 * this.skin) ** 2;
    const r = this.reference;
    for (let i = 0; i < this.N; i++) {
      const dx = x[3 * i] - r[3 * i], dy = x[3 * i + 1] - r[3 * i + 1], dz = x[3 * i + 2] - r[3 * i + 2];
      if (!(dx * dx + dy * dy + dz * dz < limit)) return true;
    }
    return false;
  }

  private rebuild(x: Float64Array): void {
    const N = this.N, L = this.box, inv = 1 / L;
    for (let i = 0; i < 3 * N; i++) x[i] -= L * Math.floor(x[i] * inv);
    this.reference.set(x);
    const rl2 = (this.rc + this.skin) ** 2;
    this.nPairs = 0;
    const n = this.nCell;
    if (n < 3) {
      for (let i = 0; i < N - 1; i++) for (let j = i + 1; j < N; j++) this.consider(x, i, j, rl2);
      return;
    }
    const head = this.head.fill(-1), next = this.next, cell = this.cellIndex;
    for (let i = 0; i < N; i++) {
      const cx = Math.min(n - 1, Math.floor(x[3 * i] * inv * n));
      const cy = Math.min(n - 1, Math.floor(x[3 * i + 1] * inv * n));
      const cz = Math.min(n - 1, Math.floor(x[3 * i + 2] * inv * n));
      const c = (cz * n + cy) * n + cx;
      cell[i] = c;
      next[i] = head[c];
      head[c] = i;
    }
    for (let i = 0; i < N; i++) {
      const c0 = cell[i];
      const cx = c0 % n, cy = Math.floor(c0 / n) % n, cz = Math.floor(c0 / (n * n));
      for (let oz = -1; oz <= 1; oz++)
        for (let oy = -1; oy <= 1; oy++)
          for (let ox = -1; ox <= 1; ox++) {
            const c = (((cz + oz + n) % n) * n + ((cy + oy + n) % n)) * n + ((cx + ox + n) % n);
            for (let j = head[c]; j >= 0; j = next[j]) if (j > i) this.consider(x, i, j, rl2);
          }
    }
  }

  private consider(x: Float64Array, i: number, j: number, rl2: number): void {
    const L = this.box, half = 0.5 * L;
    let dx = x[3 * i] - x[3 * j], dy = x[3 * i + 1] - x[3 * j + 1], dz = x[3 * i + 2] - x[3 * j + 2];
    if (dx > half) dx -= L;
    else if (dx < -half) dx += L;
    if (dy > half) dy -= L;
    else if (dy < -half) dy += L;
    if (dz > half) dz -= L;
    else if (dz < -half) dz += L;
    if (dx * dx + dy * dy + dz * dz >= rl2) return;
    if (this.nPairs === this.pairI.length) {
      const grow = Math.max(1024, 2 * this.nPairs);
      const gi = new Int32Array(grow), gj = new Int32Array(grow);
      gi.set(this.pairI);
      gj.set(this.pairJ);
      this.pairI = gi;
      this.pairJ = gj;
    }
    this.pairI[this.nPairs] = i;
    this.pairJ[this.nPairs++] = j;
  }
}
