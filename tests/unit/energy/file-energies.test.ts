/**
 * Energies carried by the trajectory file: any numeric key of an extended XYZ comment line and the H5MD
 * observables group reach the engine as per-frame numbers; the energy analysis reads the keys the user maps
 * (with units), and says when the file and the interaction model disagree, giving both values.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { interactionModelSchema } from '../../../shared/interaction-model.ts';
import { energy } from '../../../server/analysis/energy.ts';
import { assembleTrajectory } from '../../../server/formats/assemble.ts';
import { inspectTrajectory } from '../../../server/formats/inspect.ts';
import { openTrajectory } from '../../../server/formats/open-trajectory.ts';
import { compileModel, FrameEnergyEvaluator } from '../../../server/analysis/pair-energy.ts';
import { fccLattice } from '../../../server/simulate/fcc-lattice.ts';
import { SeededRandom } from '../../../server/simulate/random.ts';
import { h5, tempDir, type TempDir } from '../formats/synthetic.ts';

let dir: TempDir;
beforeAll(async () => {
  dir = await tempDir();
});
afterAll(async () => {
  await dir.remove();
});

const model = interactionModelSchema.parse({ pairs: [{ species: ['Ar', 'Ar'], form: 'lj', epsilonEV: 0.0103236, sigmaA: 3.405, cutoffA: 8.5 }] });
const A = 5.3, CELLS = 2, L = A * CELLS;

/** Jittered FCC argon frames with the model's own energy per frame (eV, system total). */
function frames(count: number) {
  const rng = new SeededRandom(4);
  const sites = fccLattice(CELLS, A);
  const n = sites.length / 3;
  const ev = new FrameEnergyEvaluator(compileModel(model, ['Ar']), new Array(n).fill('Ar'));
  return Array.from({ length: count }, () => {
    const p = sites.map((x) => Math.round((x + 0.1 * rng.normal()) * 1e6) / 1e6);
    return { positions: p, energyEV: ev.evaluate(p, 0, [L, 0, 0, 0, L, 0, 0, 0, L]).pairEV };
  });
}

function extxyz(list: ReturnType<typeof frames>, energyOf: (e: number, f: number) => number, extra = (_f: number) => ''): string {
  const n = list[0].positions.length / 3;
  return list.map((fr, f) => {
    const lines = [`${n}`, `Lattice="${L} 0 0 0 ${L} 0 0 0 ${L}" Properties=species:S:1:pos:R:3 Time=${(f * 0.01).toFixed(2)} energy=${energyOf(fr.energyEV, f)} stress="1 2 3 4 5 6 7 8 9" pbc="T T T" note=hello Epot_kJmol=${(energyOf(fr.energyEV, f) * 96.4853321233).toFixed(8)}${extra(f)}`];
    for (let i = 0; i < n; i++) lines.push(`Ar ${fr.positions[3 * i]} ${fr.positions[3 * i + 1]} ${fr.positions[3 * i + 2]}`);
    return lines.join('\n');
  }).join('\n') + '\n';
}

async function load(path: string, name: string) {
  const info = await inspectTrajectory(path, name);
  const opened = await openTrajectory(path, name);
  const traj = await assembleTrajectory(opened.frames, { length: 'angstrom', time: 'ps', velocity: 'angstrom/ps', timeStepPs: 0.01 }, { atoms: info.atoms, frames: info.frames }, name);
  return { info, traj };
}

describe('energies from the trajectory file', () => {
  it('when extended XYZ comment lines carry numeric keys, then inspection lists them and the analysis reads the mapped key in its unit, agreeing with the model', async () => {
    const list = frames(12);
    const path = dir.file('agree.extxyz');
    await (await import('node:fs/promises')).writeFile(path, extxyz(list, (e) => e));
    const { info, traj } = await load(path, 'agree.extxyz');
    expect(info.fileValues).toEqual(['energy', 'epot_kjmol']);
    expect(Array.from(traj.observables!.energy)).toEqual(list.map((f) => f.energyEV));
    const r = energy(traj, { model, fileQuantities: { potentialEnergy: { key: 'Epot_kJmol', unit: 'kJ/mol' } } });
    expect(r.sources.fileKeys).toEqual([{ quantity: 'potential energy', key: 'Epot_kJmol', unit: 'kJ/mol', guessed: false }]);
    expect(r.comparisons).toHaveLength(1);
    expect(r.comparisons[0]).toMatchObject({ quantity: 'potential energy', unit: 'eV/atom', agree: true });
    expect(Math.abs(r.comparisons[0].meanDifference)).toBeLessThan(1e-7);
  });

  it('when the file\'s energies are offset from the model\'s, then the comparison disagrees and gives both means', async () => {
    const list = frames(12);
    const path = dir.file('offset.extxyz');
    await (await import('node:fs/promises')).writeFile(path, extxyz(list, (e) => e + 0.032 * 32));
    const { traj } = await load(path, 'offset.extxyz');
    const r = energy(traj, { model, fileQuantities: { potentialEnergy: { key: 'energy', unit: 'eV' } } });
    const c = r.comparisons[0];
    expect(c.agree).toBe(false);
    expect(c.meanDifference).toBeCloseTo(0.032, 9);
    expect(c.fileMean - c.modelMean).toBeCloseTo(0.032, 9);
    expect(r.sources.potential).toBe('model');
  });

  it('when the file states a pressure but there is no model (so no virial and no tensor), then the file\'s pressure is shown and the note says what and why', async () => {
    const path = dir.file('pressure.extxyz');
    await (await import('node:fs/promises')).writeFile(path, extxyz(frames(8), (e) => e, (f) => ` press=${(1.5 + 0.01 * f).toFixed(3)}`));
    const { traj } = await load(path, 'pressure.extxyz');
    const r = energy(traj, { model: null, fileQuantities: { potentialEnergy: { key: 'energy', unit: 'eV' }, pressure: { key: 'press', unit: 'MPa' } } });
    expect(r.sources.pressure).toBe('file');
    expect(r.pressureTensorBar).toBeNull();
    // 1 MPa = 10 bar (the bar is defined as 10⁵ Pa).
    expect(r.means.pressureBar!.mean).toBeCloseTo(15.35, 9);
    expect(r.pressureNote).toBe('Shown: the pressure as the file states it, key "press" in MPa, a scalar per frame without a tensor; there is no interaction model, so no virial pressure and no pressure tensor (both need the pair forces).');
  });

  it('when the model gives the virial and tensor but the file maps no pressure, then the note says the virial is shown with nothing to compare it with', async () => {
    const path = dir.file('virial-only.extxyz');
    await (await import('node:fs/promises')).writeFile(path, extxyz(frames(8), (e) => e));
    const { traj } = await load(path, 'virial-only.extxyz');
    const r = energy(traj, { model, fileQuantities: null });
    expect(r.sources.pressure).toBe('virial');
    expect(r.pressureTensorBar).toHaveLength(6);
    expect(r.pressureNote).toMatch(/^Shown: the virial pressure and its tensor from the interaction model; none of the file's per-frame numbers is mapped as the pressure, so there is nothing to compare it with/);
  });

  it('when the model runs on open boundaries beside a file pressure, then the file\'s pressure is shown and the note says the virial needs a periodic cell', async () => {
    const path = dir.file('open.extxyz');
    await (await import('node:fs/promises')).writeFile(path, extxyz(frames(8), (e) => e, () => ' press=2.0'));
    const { traj } = await load(path, 'open.extxyz');
    const open = { ...traj, boundary: 'none' as const };
    const r = energy(open, { model, fileQuantities: { pressure: { key: 'press', unit: 'bar' } } });
    expect(r.sources.pressure).toBe('file');
    expect(r.pressureNote).toMatch(/key "press" in bar.*the model's virial pressure and tensor need a periodic cell volume, and this run has open boundaries/);
    const slab = energy({ ...traj, periodicAxes: [true, true, false] }, { model, fileQuantities: { pressure: { key: 'press', unit: 'bar' } } });
    expect(slab.sources.pressure).toBe('file');
    expect(slab.pressureNote).toMatch(/need a periodic cell volume, and this run is periodic along some directions only \(a slab\)\.$/);
    const none = energy(open, { model, fileQuantities: null });
    expect(none.pressureBar).toBeNull();
    expect(none.pressureNote).toMatch(/^No pressure: the file states none \(no per-frame number is mapped as the pressure\), and the model's virial pressure and tensor need a periodic cell volume/);
  });

  it('when a mapped key is absent, then the error names the key and lists the keys the file has', async () => {
    const path = dir.file('missing.extxyz');
    await (await import('node:fs/promises')).writeFile(path, extxyz(frames(3), (e) => e));
    const { traj } = await load(path, 'missing.extxyz');
    expect(() => energy(traj, { model, fileQuantities: { totalEnergy: { key: 'etot', unit: 'eV' } } })).toThrow(/no per-frame key "etot" for the total energy; it has energy, epot_kjmol/);
  });

  it('when an H5MD file has an observables group, then its scalar series become per-frame values (by index or by step)', async () => {
    const { File } = await h5();
    const path = dir.file('obs.h5');
    const file = new File(path, 'w');
    const atoms = file.create_group('particles').create_group('all');
    const pos = atoms.create_group('position');
    pos.create_dataset({ name: 'value', data: new Float32Array(4 * 2 * 3).map((_, k) => k % 7), shape: [4, 2, 3] });
    pos.create_dataset({ name: 'step', data: Int32Array.from([0, 10, 20, 30]) });
    pos.create_dataset({ name: 'time', data: Float64Array.from([0, 0.1, 0.2, 0.3]) });
    const obs = file.create_group('observables');
    const pe = obs.create_group('potential_energy');
    pe.create_dataset({ name: 'value', data: Float64Array.from([-1, -2, -3, -4]) });
    const p = obs.create_group('pressure');
    p.create_dataset({ name: 'value', data: Float64Array.from([5, 7]) });
    p.create_dataset({ name: 'step', data: Int32Array.from([10, 30]) });
    file.close();
    const { info, traj } = await load(path, 'obs.h5');
    expect(info.fileValues).toEqual(['potential_energy', 'pressure']);
    expect(Array.from(traj.observables!.potential_energy)).toEqual([-1, -2, -3, -4]);
    expect(Array.from(traj.observables!.pressure)).toEqual([NaN, 5, NaN, 7]);
  });
});
