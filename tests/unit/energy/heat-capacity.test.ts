import { describe, expect, it } from 'vitest';
import { BOLTZMANN_EV_PER_K } from '../../../shared/energy-units.ts';
import { BOLTZMANN_ENGINE } from '../../../server/analysis/constants.ts';
import { energy } from '../../../server/analysis/energy.ts';
import type { Trajectory } from '../../../server/analysis/trajectory.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';

// Classical harmonic crystal (Einstein model: each atom tethered to its FCC site by a spring k). Its exact
// classical heat capacity is 3k_B per atom (Dulong–Petit, SCIENCE items 16 and 28). Frames are exact samples
// of the canonical (NVT) or microcanonical (NVE) distribution, and the potential energy comes from the file
// (per-frame "energy" key, eV), as an extended XYZ comment would carry it.
const MASS = 39.948, K_SPRING_EV_PER_A2 = 0.5, N_CELLS = 2;

function harmonicCrystal(ensemble: 'NVT' | 'NVE', frames: number, temperatureK: number, seed: number): Trajectory {
  const sites = fccLattice(N_CELLS, 5.3);
  const N = sites.length / 3;
  const rng = new SeededRandom(seed);
  const positions = new Float32Array(3 * N * frames), velocities = new Float32Array(3 * N * frames);
  const energyEV = new Float64Array(frames);
  const kT = BOLTZMANN_EV_PER_K * temperatureK;
  const sx = Math.sqrt(kT / K_SPRING_EV_PER_A2), sv = Math.sqrt((BOLTZMANN_ENGINE * temperatureK) / MASS);
  const z = new Float64Array(6 * N);
  for (let f = 0; f < frames; f++) {
    for (let k = 0; k < z.length; k++) z[k] = rng.normal();
    if (ensemble === 'NVE') {
      // Uniform on the energy shell: scale the 6N-dimensional Gaussian vector to the fixed radius √(6N).
      const norm = Math.sqrt(z.reduce((a, b) => a + b * b, 0));
      for (let k = 0; k < z.length; k++) z[k] *= Math.sqrt(6 * N) / norm;
    }
    let u = 0;
    for (let k = 0; k < 3 * N; k++) {
      const dx = sx * z[k];
      positions[3 * N * f + k] = sites[k] + dx;
      velocities[3 * N * f + k] = sv * z[3 * N + k];
      u += 0.5 * K_SPRING_EV_PER_A2 * dx * dx;
    }
    energyEV[f] = u;
  }
  const L = N_CELLS * 5.3;
  const cells = new Float64Array(9 * frames);
  for (let f = 0; f < frames; f++) (cells[9 * f] = L), (cells[9 * f + 4] = L), (cells[9 * f + 8] = L);
  return {
    nAtoms: N, nFrames: frames, species: new Array(N).fill('Ar'), positions, velocities, cells,
    times: Float64Array.from({ length: frames }, (_, f) => f * 0.05), boundary: 'periodic', observables: { energy: energyEV },
  };
}

describe('heat capacity from fluctuations of a classical harmonic crystal (SCIENCE item 28)', () => {
  it('when frames sample the canonical ensemble (NVT), then C_V = ⟨δE²⟩/(k_B T²) gives 3 k_B per atom within its block error, and 40 independent runs cover the truth as often as ±1σ and ±2σ claim', () => {
    let within1 = 0, within2 = 0;
    const runs = 40;
    for (let s = 0; s < runs; s++) {
      const r = energy(harmonicCrystal('NVT', 600, 50, 100 + s), { ensemble: 'NVT', temperatureK: 50, degreesOfFreedom: 96, masses: { Ar: MASS } });
      const c = r.heatCapacity!;
      expect(c.method).toBe('canonical total-energy fluctuation');
      const z = Math.abs(c.perAtomKB - 3) / c.perAtomKBStdError;
      if (z <= 1) within1++;
      if (z <= 2) within2++;
      expect(c.perAtomKBStdError / 3).toBeLessThan(0.1);
    }
    // Binomial spread over 40 runs: ±1σ covers 68 % (accept 50–85 %), ±2σ 95 % (accept ≥ 85 %).
    expect(within1 / runs).toBeGreaterThan(0.5);
    expect(within1 / runs).toBeLessThan(0.85);
    expect(within2 / runs).toBeGreaterThanOrEqual(0.85);
  });

  it('when frames sample the microcanonical shell (NVE), then Lebowitz–Percus–Verlet from kinetic fluctuations gives 3 k_B per atom within 3σ', () => {
    const r = energy(harmonicCrystal('NVE', 4000, 50, 7), { ensemble: 'NVE', degreesOfFreedom: 96, masses: { Ar: MASS } });
    const c = r.heatCapacity!;
    expect(c.method).toMatch(/Lebowitz–Percus–Verlet/);
    expect(Math.abs(c.perAtomKB - 3)).toBeLessThan(3 * c.perAtomKBStdError);
    expect(c.perAtomKBStdError).toBeLessThan(0.3);
    // The same frames read as canonical would be wrong: the total energy does not fluctuate at all.
    expect(energy(harmonicCrystal('NVE', 400, 50, 8), { ensemble: 'NVT', temperatureK: 50, degreesOfFreedom: 96 }).heatCapacity!.perAtomKB).toBeLessThan(0.01);
  });

  it('when the potential comes from the file key "energy" without a mapping, then the report says the key and unit were guessed', () => {
    const r = energy(harmonicCrystal('NVT', 100, 50, 9), { ensemble: 'NVT' });
    expect(r.sources.potential).toBe('file');
    expect(r.sources.fileKeys).toEqual([{ quantity: 'potential energy', key: 'energy', unit: 'eV', guessed: true }]);
  });

  it('when the run states no ensemble, then no fluctuation heat capacity is given and the note says why', () => {
    const r = energy(harmonicCrystal('NVT', 100, 50, 10), {});
    expect(r.heatCapacity).toBeNull();
    expect(r.heatCapacityNote).toMatch(/ensemble/);
  });
});

describe('isobaric heat capacity from enthalpy fluctuations (SCIENCE item 28)', () => {
  it('when an ideal gas samples the NPT ensemble exactly, then C_P = ⟨δH²⟩/(k_B T²) gives (5/2 + 1/N) k_B per atom within its error [exact: V ~ Gamma(N+1, k_BT/P), COMMON PRACTICE]', async () => {
    const { interactionModelSchema } = await import('../../../shared/interaction-model.ts');
    const { BAR_PER_EV_PER_A3 } = await import('../../../shared/energy-units.ts');
    const N = 100, frames = 3000, T = 150, pBar = 200;
    const rng = new SeededRandom(31);
    const kT = BOLTZMANN_EV_PER_K * T, pEV = pBar / BAR_PER_EV_PER_A3;
    const positions = new Float32Array(3 * N * frames), velocities = new Float32Array(3 * N * frames), cells = new Float64Array(9 * frames);
    const sv = Math.sqrt((BOLTZMANN_ENGINE * T) / MASS);
    for (let f = 0; f < frames; f++) {
      let gamma = 0;
      for (let k = 0; k <= N; k++) gamma -= Math.log(1 - rng.uniform());
      const L = Math.cbrt((gamma * kT) / pEV);
      cells[9 * f] = cells[9 * f + 4] = cells[9 * f + 8] = L;
      for (let k = 0; k < 3 * N; k++) {
        positions[3 * N * f + k] = rng.uniform() * L;
        velocities[3 * N * f + k] = sv * rng.normal();
      }
    }
    const traj: Trajectory = { nAtoms: N, nFrames: frames, species: new Array(N).fill('Ar'), positions, velocities, cells, times: Float64Array.from({ length: frames }, (_, f) => f * 0.05), boundary: 'periodic' };
    const model = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'none' }] });
    const r = energy(traj, { model, ensemble: 'NPT', temperatureK: T, externalPressureBar: pBar, degreesOfFreedom: 3 * N, masses: { Ar: MASS } });
    const c = r.heatCapacity!;
    expect(c.quantity).toBe('C_P');
    expect(c.pressureBar).toBe(pBar);
    expect(Math.abs(c.perAtomKB - (2.5 + 1 / N))).toBeLessThan(3 * c.perAtomKBStdError);
    expect(c.perAtomKBStdError).toBeLessThan(0.15);
  });
});
