import { describe, expect, it } from 'vitest';
import { msd } from '../../../server/analysis/msd.ts';
import { vacf } from '../../../server/analysis/vacf.ts';
import { ornsteinUhlenbeck } from './synthetic.ts';

// SCIENCE item 3: Ornstein–Uhlenbeck velocities [CONFIRMED Uhlenbeck & Ornstein, Phys. Rev. 36, 823 (1930)],
// Green–Kubo D = k_BT/(mγ) [CONFIRMED Kubo 1957]. γ = 1/ps, k_BT/m = 1 Å²/ps², Δt = 0.05 ps,
// N = 300, 4000 steps; tolerance 6 % at N = 300 (SCIENCE prototype: σ_stat 1.2–2 %, worst 3 %).
describe('VACF and Green–Kubo on an Ornstein–Uhlenbeck process (SCIENCE item 3)', () => {
  const traj = ornsteinUhlenbeck(300, 4000, 0.05, 1, 1, 2024);
  const v = vacf(traj, { removeComDrift: false });
  const g = v.groups[0];

  it('when velocities are stored, then the VACF uses them and C(0) per component is 1 within 1 %', () => {
    expect(v.velocitySource).toBe('stored-velocities');
    expect(Math.abs(g.vacfA2PerPs2[0] / 3 - 1)).toBeLessThan(0.01);
  });

  it('when t = 1/γ, then C(t)/C(0) = e^{−1} within 4 %', () => {
    expect(Math.abs(g.normalised[20] / Math.exp(-1) - 1)).toBeLessThan(0.04);
  });

  it('when the Green–Kubo integral runs to t = 10/γ, then D = k_BT/(mγ) = 1 within 6 %', () => {
    const manual = vacf(traj, { removeComDrift: false, gkWindowPs: { startPs: 10, endPs: 10 } }).groups[0].greenKubo;
    expect(Math.abs(manual.d.a2PerPs - 1)).toBeLessThan(0.06);
    expect(g.runningDA2PerPs[200]).toBeCloseTo(manual.d.a2PerPs, 12);
  });

  it('when the plateau is chosen automatically, then it has converged and D is within 6 %', () => {
    expect(g.greenKubo.converged).toBe(true);
    expect(g.greenKubo.window.source).toBe('auto');
    expect(Math.abs(g.greenKubo.d.a2PerPs - 1)).toBeLessThan(0.06);
  });

  it('when D comes from the MSD slope over t ∈ [10, 40]/γ, then it is within 6 % of 1, and so is the automatic window', () => {
    const m = msd(traj, { removeComDrift: false, fitWindowPs: { startPs: 10, endPs: 40 } });
    expect(Math.abs((m.groups[0].diffusion.d?.a2PerPs ?? 0) - 1)).toBeLessThan(0.06);
    const auto = msd(traj, { removeComDrift: false }).groups[0].diffusion;
    expect(auto.regime).toBe('diffusive');
    expect(Math.abs((auto.d?.a2PerPs ?? 0) - 1)).toBeLessThan(0.06);
  });

  it('when t = 2/γ, then the MSD matches 6·D·[t − (1 − e^{−γt})/γ] within 3 %', () => {
    const m = msd(traj, { removeComDrift: false });
    const exact = 6 * (2 - (1 - Math.exp(-2)));
    expect(Math.abs(m.groups[0].msdA2[40] / exact - 1)).toBeLessThan(0.03);
  });

  it('when velocities are absent, then central differences of positions are used and say so, and D still agrees', () => {
    const fromPositions = vacf(traj, { removeComDrift: false, forceFromPositions: true });
    expect(fromPositions.velocitySource).toBe('central-differences');
    expect(Math.abs(fromPositions.groups[0].greenKubo.d.a2PerPs - 1)).toBeLessThan(0.08);
  });
});
