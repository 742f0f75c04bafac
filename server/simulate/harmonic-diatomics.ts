/**
 * A box of independent harmonic diatomics, for checking vibrational spectra
 * against handbook harmonic wavenumbers. Each molecule gets a random centre,
 * a Maxwell–Boltzmann centre-of-mass velocity, a random bond direction and a
 * canonical vibrational amplitude and phase at the given temperature.
 *
 * Molecules do not rotate unless asked: rotation couples to the bond
 * stretch (centrifugal stretching, rotational side bands) and would move
 * the peak away from ω = √(k/μ). Without rotation the motion is exactly
 * one-dimensional, so the "analytic" path is exact and the velocity-Verlet
 * path shows the integrator's frequency, (2/Δt)·arcsin(ωΔt/2).
 */
import { massOf } from '../../shared/elements.ts';
import { ATOMIC_MASS_UNIT_KG, BOLTZMANN_ENGINE, SECOND_PER_PS, SPEED_OF_LIGHT_M_PER_S } from '../analysis/constants.ts';
import type { Trajectory } from '../analysis/trajectory.ts';
import { SeededRandom } from './random.ts';

export interface HarmonicDiatomicsOptions {
  molecules: number;
  speciesA: string;
  speciesB: string;
  /** Masses in u; default the standard atomic weights. */
  massA?: number;
  massB?: number;
  /** Give one of: force constant in N/m, or harmonic wavenumber in cm⁻¹. */
  forceConstantNPerM?: number;
  wavenumberCm1?: number;
  bondLengthA: number;
  temperatureK: number;
  timeStepPs: number;
  frames: number;
  /** Integrator steps between stored frames (Verlet only; default 1). */
  sampleEvery?: number;
  integrator: 'analytic' | 'verlet';
  boxA: number;
  seed: number;
  rotate?: boolean;
  /** Give each molecule a thermal centre-of-mass velocity (default true); false leaves only the stretch. */
  translate?: boolean;
  /**
   * Give every stretch exactly k_BT of energy with a random phase instead of
   * canonical amplitudes, so each molecule's mean stretch kinetic energy is
   * k_BT/2 exactly rather than on average over many molecules.
   */
  equipartitionEnergy?: boolean;
}

export interface HarmonicDiatomicsRun {
  trajectory: Trajectory;
  /** Harmonic angular frequency √(k/μ), rad/ps. */
  omegaRadPerPs: number;
  reducedMassU: number;
  forceConstantEngine: number;
}

/** N/m → u/ps². */
const ENGINE_PER_N_PER_M = SECOND_PER_PS ** 2 / ATOMIC_MASS_UNIT_KG;

export function simulateHarmonicDiatomics(o: HarmonicDiatomicsOptions): HarmonicDiatomicsRun {
  const mA = o.massA ?? massOf(o.speciesA), mB = o.massB ?? massOf(o.speciesB);
  const M = mA + mB, mu = (mA * mB) / M;
  let k: number;
  if (o.forceConstantNPerM !== undefined) k = o.forceConstantNPerM * ENGINE_PER_N_PER_M;
  else if (o.wavenumberCm1 !== undefined) k = mu * (2 * Math.PI * SPEED_OF_LIGHT_M_PER_S * 100 * o.wavenumberCm1 * SECOND_PER_PS) ** 2;
  else throw new Error('Give a force constant or a wavenumber.');
  if (o.rotate && o.integrator === 'analytic') throw new Error('Rotating molecules need the Verlet integrator.');
  const omega = Math.sqrt(k / mu);
  const kT = BOLTZMANN_ENGINE * o.temperatureK;
  const rng = new SeededRandom(o.seed);
  const nMol = o.molecules, N = 2 * nMol, T = o.frames;
  const positions = new Float32Array(3 * N * T), velocities = new Float32Array(3 * N * T);
  const n = new Float64Array(3);
  const x = new Float64Array(3 * N), v = new Float64Array(3 * N);
  const xi0 = new Float64Array(nMol), vi0 = new Float64Array(nMol), axes = new Float64Array(3 * nMol);
  const com = new Float64Array(3 * nMol), vcom = new Float64Array(3 * nMol);
  for (let m = 0; m < nMol; m++) {
    rng.unitVector(n);
    axes.set(n, 3 * m);
    for (let c = 0; c < 3; c++) {
      com[3 * m + c] = rng.uniform() * o.boxA;
      const u = rng.normal();
      vcom[3 * m + c] = o.translate === false ? 0 : Math.sqrt(kT / M) * u;
    }
    xi0[m] = Math.sqrt(kT / k) * rng.normal();
    vi0[m] = Math.sqrt(kT / mu) * rng.normal();
    if (o.equipartitionEnergy) {
      const phase = Math.atan2(-vi0[m] / omega, xi0[m]);
      const amplitude = Math.sqrt((2 * kT) / k);
      xi0[m] = amplitude * Math.cos(phase);
      vi0[m] = -amplitude * omega * Math.sin(phase);
    }
  }
  const place = (m: number, t: number, xi: number, vxi: number, out: Float64Array, outV: Float64Array): void => {
    const r = o.bondLengthA + xi;
    for (let c = 0; c < 3; c++) {
      const a = axes[3 * m + c];
      const centre = com[3 * m + c] + vcom[3 * m + c] * t;
      out[6 * m + c] = centre - (mB / M) * r * a;
      out[6 * m + 3 + c] = centre + (mA / M) * r * a;
      outV[6 * m + c] = vcom[3 * m + c] - (mB / M) * vxi * a;
      outV[6 * m + 3 + c] = vcom[3 * m + c] + (mA / M) * vxi * a;
    }
  };
  const store = (frame: number): void => {
    const base = 3 * N * frame;
    for (let i = 0; i < 3 * N; i++) {
      positions[base + i] = x[i] - o.boxA * Math.floor(x[i] / o.boxA);
      velocities[base + i] = v[i];
    }
  };
  const every = o.integrator === 'verlet' ? Math.max(1, o.sampleEvery ?? 1) : 1;
  if (o.integrator === 'analytic') {
    for (let f = 0; f < T; f++) {
      const t = f * o.timeStepPs;
      for (let m = 0; m < nMol; m++) {
        const c = Math.cos(omega * t), s = Math.sin(omega * t);
        place(m, t, xi0[m] * c + (vi0[m] / omega) * s, -xi0[m] * omega * s + vi0[m] * c, x, v);
      }
      store(f);
    }
  } else {
    for (let m = 0; m < nMol; m++) place(m, 0, xi0[m], vi0[m], x, v);
    if (o.rotate) addRotation(x, v, nMol, mA, mB, kT, rng);
    const f = new Float64Array(3 * N);
    const dt = o.timeStepPs;
    const forces = (): void => {
      for (let m = 0; m < nMol; m++) {
        const a = 6 * m, b = 6 * m + 3;
        const dx = x[b] - x[a], dy = x[b + 1] - x[a + 1], dz = x[b + 2] - x[a + 2];
        const r = Math.hypot(dx, dy, dz);
        const s = (-k * (r - o.bondLengthA)) / r;
        f[b] = s * dx;
        f[b + 1] = s * dy;
        f[b + 2] = s * dz;
        f[a] = -s * dx;
        f[a + 1] = -s * dy;
        f[a + 2] = -s * dz;
      }
    };
    const inv = (i: number): number => (Math.floor(i / 3) % 2 === 0 ? 1 / mA : 1 / mB);
    const invMass = Float64Array.from({ length: 3 * N }, (_, i) => inv(i));
    forces();
    store(0);
    for (let frame = 1; frame < T; frame++) {
      for (let s = 0; s < every; s++) {
        for (let i = 0; i < 3 * N; i++) {
          v[i] += 0.5 * dt * f[i] * invMass[i];
          x[i] += dt * v[i];
        }
        forces();
        for (let i = 0; i < 3 * N; i++) v[i] += 0.5 * dt * f[i] * invMass[i];
      }
      store(frame);
    }
  }
  const cells = new Float64Array(9 * T);
  for (let fr = 0; fr < T; fr++) (cells[9 * fr] = o.boxA), (cells[9 * fr + 4] = o.boxA), (cells[9 * fr + 8] = o.boxA);
  const species: string[] = [];
  for (let m = 0; m < nMol; m++) species.push(o.speciesA, o.speciesB);
  const dtFrame = o.timeStepPs * every;
  return {
    trajectory: { nAtoms: N, nFrames: T, species, positions, velocities, cells, times: Float64Array.from({ length: T }, (_, i) => i * dtFrame), boundary: 'periodic' },
    omegaRadPerPs: omega,
    reducedMassU: mu,
    forceConstantEngine: k,
  };
}

/** Thermal angular velocity about a random axis perpendicular to each bond. */
function addRotation(x: Float64Array, v: Float64Array, nMol: number, mA: number, mB: number, kT: number, rng: SeededRandom): void {
  const u = new Float64Array(3);
  for (let m = 0; m < nMol; m++) {
    const a = 6 * m, b = a + 3;
    const d = [x[b] - x[a], x[b + 1] - x[a + 1], x[b + 2] - x[a + 2]];
    const r = Math.hypot(d[0], d[1], d[2]);
    const inertia = ((mA * mB) / (mA + mB)) * r * r;
    rng.unitVector(u);
    const dot = (u[0] * d[0] + u[1] * d[1] + u[2] * d[2]) / r;
    for (let c = 0; c < 3; c++) u[c] -= (dot * d[c]) / r;
    const un = Math.hypot(u[0], u[1], u[2]);
    // Two rotational degrees of freedom: |ω| from a 2-D Maxwell distribution.
    const w = Math.sqrt(kT / inertia) * Math.hypot(rng.normal(), rng.normal());
    const wv = [(w * u[0]) / un, (w * u[1]) / un, (w * u[2]) / un];
    const cross = (p: number[]): number[] => [wv[1] * p[2] - wv[2] * p[1], wv[2] * p[0] - wv[0] * p[2], wv[0] * p[1] - wv[1] * p[0]];
    const ra = d.map((q) => (-mB / (mA + mB)) * q), rb = d.map((q) => (mA / (mA + mB)) * q);
    const va = cross(ra), vb = cross(rb);
    for (let c = 0; c < 3; c++) (v[a + c] += va[c]), (v[b + c] += vb[c]);
  }
}
