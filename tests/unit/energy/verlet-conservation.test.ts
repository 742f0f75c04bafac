import { describe, expect, it } from 'vitest';
import { interactionModelSchema } from '../../../shared/interaction-model.ts';
import { energy } from '../../../server/analysis/energy.ts';
import { BOLTZMANN_ENGINE } from '../../../server/analysis/constants.ts';
import { simulateLennardJones } from '../../../server/simulate/lennard-jones.ts';

// The repo's own velocity-Verlet integrator (server/simulate/lennard-jones.ts) on an argon-like LJ liquid.
// SCIENCE item 29 [COMMON PRACTICE; Allen & Tildesley FROM MEMORY]: for a smooth potential the energy
// fluctuation of velocity Verlet scales as Δt², so halving Δt cuts it about fourfold. The pair potential is
// force-shifted at 2.5σ, so force and energy are continuous at the cut-off (a plain shift leaves a force jump
// whose crossings add an error of lower order).
const SIGMA = 3.405, EPS_K = 119.8, MASS = 39.948;
const TAU = SIGMA * Math.sqrt(MASS / (EPS_K * BOLTZMANN_ENGINE));
const model = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonK: EPS_K, sigmaA: SIGMA, cutoffA: 2.5 * SIGMA, truncation: 'force-shifted' }] });

/** Same melted and equilibrated start (Δt = 0.004τ), then 16τ of NVE at the production step. */
function nve(productionStepTau: number, seed: number) {
  const dt = productionStepTau * TAU;
  const steps = Math.round((16 * TAU) / dt);
  const run = simulateLennardJones({
    cellsPerSide: 4, reducedDensity: 0.8442, temperatureK: 90, meltTemperatureK: 250, meltSteps: 300, equilibrationSteps: 600,
    productionSteps: steps, sampleEvery: Math.max(1, Math.round(steps / 800)), seed, productionTimeStepPs: dt, forceShifted: true,
  });
  return { run, result: energy(run.trajectory, { model, ensemble: 'NVE' }) };
}

describe('energy conservation of the velocity-Verlet integrator (SCIENCE item 29)', () => {
  const coarse = nve(0.008, 5), fine = nve(0.004, 5), finer = nve(0.002, 5);

  it('when Δt is halved twice, then the total-energy fluctuation drops about fourfold each time (3 to 5.3)', () => {
    const s = [coarse, fine, finer].map((r) => r.result.drift!.totalStdPerAtomEV);
    expect(s[0] / s[1]).toBeGreaterThan(3);
    expect(s[0] / s[1]).toBeLessThan(5.3);
    expect(s[1] / s[2]).toBeGreaterThan(3);
    expect(s[1] / s[2]).toBeLessThan(5.3);
  });

  it('when the analysis recomputes the potential from the stored frames, then it matches the integrator\'s own energy to Float32 rounding', () => {
    const { run, result } = fine;
    for (let f = 0; f < run.potentialEV.length; f += 50) {
      expect(Math.abs(result.potentialPerAtomEV![f] * result.atoms - run.potentialEV[f])).toBeLessThan(1e-5);
    }
  });

  it('when the step is sensible (0.004τ), then the NVE drift card reports the drift within the default threshold of 0.01 k_BT per atom per ns', () => {
    expect(fine.result.nveCheck).toMatchObject({ status: 'within', thresholdKTPerNs: 0.01, thresholdSource: 'default (common practice)' });
  });

  it('when the step is deliberately too large (0.02τ), then the NVE drift card fires; a user threshold 100× looser silences it', () => {
    const big = nve(0.02, 7);
    expect(big.result.nveCheck?.status).toBe('exceeds');
    expect(big.result.drift!.perAtomEVPerNs).toBeGreaterThan(10 * fine.result.nveCheck!.thresholdEVPerAtomPerNs);
    const loose = energy(big.run.trajectory, { model, ensemble: 'NVE', driftThresholdKTPerNs: 100 });
    expect(loose.nveCheck).toMatchObject({ status: 'within', thresholdSource: 'given' });
    // Not NVE: no conservation card at all.
    expect(energy(big.run.trajectory, { model, ensemble: 'NVT' }).nveCheck).toBeNull();
  });
});
