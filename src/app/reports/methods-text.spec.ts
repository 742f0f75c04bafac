import { describe, expect, it } from 'vitest';
import type { ReportDto } from '../../../shared/report';
import { headlineCards } from './headline-cards';
import { methodsParagraphs, methodsPlainText } from './methods-text';

const D = (a2PerPs: number) => ({ a2PerPs, e9M2PerS: a2PerPs * 10, cm2PerS: a2PerPs * 1e-4 });

function report(overrides: Partial<ReportDto> = {}): ReportDto {
  return {
    id: 7, projectId: 1, trajectoryId: 2, trajectoryName: 'argon-liquid.extxyz', runId: 3, title: 'argon', notes: '', analyses: ['thermo', 'msd'],
    params: { components: 'xyz', window: 'hann', zeroPadFactor: 1 },
    summary: {
      thermo: { temperatureK: { mean: 86.5, stdError: 1.2 }, densityGPerCm3: null, degreesOfFreedom: 321, equilibrated: true },
      msd: { dimensions: 3, groups: [{ label: 'all', atoms: 108, regime: 'diffusive', d: D(0.16), dStdError: D(0.01), uncertaintyMethod: 'atom-blocks', slopeExponent: 1, fitWindowPs: { start: 0.9, end: 1.7, source: 'auto' }, plateauA2: null }] },
    },
    methods: {
      input: { file: 'argon-liquid.extxyz', sha256: 'ab'.repeat(32), atoms: 108, frames: 201, timeStep: 0.02, timeUnit: 'ps', ensemble: 'NVE' },
      thermo: { velocitySource: 'stored-velocities', blockingPlateauLevel: 3 },
      msd: { unwrapped: true, comDriftRemoved: true },
    },
    engineVersion: '0.1.0', inputSha256: 'ab'.repeat(32), createdAt: '2026-03-04T10:00:00.000Z', curves: {},
    ...overrides,
  };
}

describe('methods text', () => {
  it('when a report is described, then the input names file, checksum, size and time step, and the software names engine version and date', () => {
    const paragraphs = methodsParagraphs(report());
    const input = paragraphs[0]!.body;
    expect(input).toContain('argon-liquid.extxyz');
    expect(input).toContain(`SHA-256 ${'ab'.repeat(32)}`);
    expect(input).toContain('108 atoms, 201 frames');
    expect(input).toContain('time step between frames 0.02 ps');
    expect(input).toContain('ensemble NVE');
    expect(paragraphs.at(-1)!.body).toContain('engine 0.1.0 on 2026-03-04');
  });

  it('when thermo and MSD ran, then their paragraphs state the DOF, the blocking method, the FFT MSD, the Einstein relation and the fit window used', () => {
    const [, thermo, msd] = methodsParagraphs(report());
    expect(thermo!.body).toContain('f = 321 degrees of freedom');
    expect(thermo!.body).toContain('Flyvbjerg–Petersen blocking');
    expect(msd!.body).toContain('FFT (Wiener–Khinchin)');
    expect(msd!.body).toContain('MSD(t) = 2·3·D·t');
    expect(msd!.body).toContain('0.9–1.7 ps (chosen automatically)');
    expect(msd!.body).toContain('standard error from the spread of D over independent groups of atoms');
  });

  it('when the run drifted and the thermo check found where it settles, then the temperature paragraph says so; an equilibrated run says nothing of it', () => {
    const base = report();
    const drifting = report({ summary: { ...base.summary, thermo: { ...base.summary.thermo!, equilibrated: false, suggestedDiscardPs: 3.4 } } });
    expect(methodsParagraphs(drifting)[1]!.body).toContain('a significant drift was found. By automated equilibration detection (Chodera 2016) the temperature settles after about 3.4 ps from the start of the range.');
    expect(methodsParagraphs(base)[1]!.body).not.toContain('settles');
  });

  it('when the fit and plateau windows were set by hand, then the text says so and never that they were chosen automatically', () => {
    const auto = report();
    const msdGroup = { ...auto.summary.msd!.groups[0]!, fitWindowPs: { start: 2, end: 8, source: 'manual' as const } };
    const vacf = { velocitySource: 'stored-velocities' as const, groups: [{ label: 'all', atoms: 108, dGreenKubo: D(0.15), dStdError: D(0.01), uncertaintyMethod: 'atom-blocks' as const, spread: D(0.01), converged: true, plateauWindowPs: { start: 1, end: 3, source: 'manual' as const } }] };
    const byHand = report({ analyses: ['thermo', 'msd', 'vacf'], summary: { ...auto.summary, msd: { dimensions: 3, groups: [msdGroup] }, vacf }, methods: { ...auto.methods, vacf: {} } });
    const text = methodsPlainText(methodsParagraphs(byHand), '');
    expect(text).toContain('by a least-squares line over a window set by hand — all: 2–8 ps (set by hand)');
    expect(text).toContain('read as the mean of the running integral over a window set by hand — all: 1–3 ps (set by hand)');
    expect(text).not.toMatch(/automatic|slope is near 1/);
    expect(methodsPlainText(methodsParagraphs(auto), '')).toContain('over the window where the log–log slope is near 1 — all: 0.9–1.7 ps (chosen automatically)');
  });

  it('when an analysis did not run, then it has no paragraph', () => {
    const headings = methodsParagraphs(report()).map((p) => p.heading);
    expect(headings).toEqual(['Input', 'Temperature', 'Mean-square displacement and diffusion', 'Software']);
  });

  it('when the text is copied, then it ends with the caution', () => {
    const text = methodsPlainText(methodsParagraphs(report()), 'A simulation is a model.');
    expect(text.startsWith('Input. Trajectory argon-liquid.extxyz')).toBe(true);
    expect(text.endsWith('\n\nA simulation is a model.')).toBe(true);
  });

  it('when velocities came from positions, then the temperature and VDOS paragraphs state the finite-difference correction and repeat the warning', () => {
    const base = report();
    const warning = 'Frames are 5.00 fs apart and carry no velocities: 6.3 % of the velocity spectrum lies above 2502 cm⁻¹.';
    const paragraphs = methodsParagraphs(report({
      analyses: ['thermo', 'vdos'],
      summary: {
        thermo: { ...base.summary.thermo!, velocitySource: 'central-differences', differenceCorrection: 1.97, warnings: [warning] },
        vdos: {
          temperatureK: 151.9, kineticTemperatureK: 151.9, velocitySource: 'central-differences', warnings: [warning],
          differenceCorrection: { correctedUpToCm1: 2502, uncorrectableFraction: 0.063, factor: 4.9 },
          peaks: [], cv: { quantum: { perAtomKB: 0, jPerMolK: 0, jPerGK: 0 }, classical: { perAtomKB: 0.5, jPerMolK: 4.2, jPerGK: 0.2 } },
          entropy: { quantum: { perAtomKB: 0, jPerMolK: 0 }, classical: { perAtomKB: 0, jPerMolK: 0 } }, zeroPoint: { evPerAtom: 0.1, kJPerMol: 9 }, modes: 64,
        },
      },
      methods: { ...base.methods, thermo: { velocitySource: 'central-differences', differenceCorrection: 1.97, blockingPlateauLevel: 2 }, vdos: { window: 'hann', segments: 1, segmentFrames: 4094, fftLength: 4096, binWidthThz: 0.098 } },
    }));
    const thermo = paragraphs.find((p) => p.heading === 'Temperature')!.body;
    const spectrum = paragraphs.find((p) => p.heading === 'Vibrational density of states')!.body;
    expect(thermo).toContain('scaled by 1.97, the ratio of the corrected to the raw velocity spectrum');
    expect(thermo).toContain(`Warning: ${warning}`);
    expect(spectrum).toContain('power spectrum of the atoms\' windowed velocities');
    expect(spectrum).toContain('divided by that factor up to 2502 cm⁻¹ (ωΔt = 3π/4), and 6.3 % of its raw weight lay above');
    expect(spectrum).toContain(`Warning: ${warning}`);
  });
  it('when a run used a frame range, a stride and a discard, then a frames paragraph says which frames the engine saw, counted from 1 as in the viewer', () => {
    const m = { ...report().methods, frames: { from: 301, to: 3100, stride: 5, used: 560, discardedFrames: 201, discardPs: 2.004, autoStride: false } };
    const frames = methodsParagraphs(report({ methods: m })).find((p) => p.heading === 'Frames')!;
    expect(frames.body).toBe('Analysed 560 frames, from frame 302 up to frame 3100, every 5th frame. The first 2.004 ps of the range (201 frames) were left out for equilibration.');
    expect(methodsParagraphs(report()).some((p) => p.heading === 'Frames')).toBe(false);
  });
});

describe('methods text of the Lindemann index', () => {
  const base = { id: 1, projectId: 1, trajectoryId: 1, trajectoryName: 't', runId: 1, title: 't', notes: '', analyses: ['lindemann'], params: {}, engineVersion: '0.2.0', inputSha256: null, createdAt: '2026-01-01T00:00:00Z', curves: {} };
  it('when the bulk form was used, then the text names the per-atom definition, r_nn and that it does not depend on size; a cluster names the all-pairs form', () => {
    const bulk = methodsParagraphs({ ...base, summary: { lindemann: { index: 0.046, form: 'per-atom', threshold: 0.1, melted: false, displacementRatio: 0.046, nearestNeighbourA: 3.72 } }, methods: { lindemann: { form: 'per-atom', framesUsed: 40, nearestNeighbourA: 3.72 } } })
      .find((p) => p.heading === 'Lindemann index')!.body;
    expect(bulk).toContain('δ_i = √⟨|u_i − ⟨u_i⟩|²⟩/r_nn');
    expect(bulk).toContain('r_nn = 3.72 Å');
    expect(bulk).toContain('does not depend on the number of atoms');
    const cluster = methodsParagraphs({ ...base, summary: { lindemann: { index: 0.03, form: 'all-pairs', threshold: 0.1, melted: false, displacementRatio: 0.05 } }, methods: { lindemann: { form: 'all-pairs', pairs: 5778, frameStride: 1, framesUsed: 40 } } })
      .find((p) => p.heading === 'Lindemann index')!.body;
    expect(cluster).toContain('Cluster form (no periodic cell)');
    expect(cluster).toContain('over 5778 pairs');
  });
});

describe('methods text of a slab (periodic along x and y only)', () => {
  const note = 'Periodic along x, y only: D from the 2-dimensional MSD along x, y (MSD = 2·2·D·t); z, which does not repeat, is shown on its own and left out of D.';
  const refused = 'g(r) is not computed for a system periodic along x and y only: its ideal-gas normalisation assumes atoms fill a cell repeating in all three directions.';
  const slab = report({
    analyses: ['msd', 'rdf'],
    summary: {
      msd: { dimensions: 2, components: 'xy', partlyPeriodic: { periodicAxes: 'xy', note }, groups: [{ label: 'all', atoms: 256, regime: 'diffusive', d: D(0.5), dStdError: D(0.01), uncertaintyMethod: 'atom-blocks', slopeExponent: 1, fitWindowPs: { start: 1, end: 5, source: 'auto' }, plateauA2: null }] },
      rdf: { pairs: [], refused },
    },
    methods: { input: { file: 'slab.extxyz', sha256: 'ab'.repeat(32), atoms: 256, frames: 400 }, msd: { unwrapped: true, comDriftRemoved: true }, rdf: { refused } },
  });

  it('when the MSD of a slab is described, then the text says unwrapping and the minimum image act along x and y only, that D is 2-dimensional, and why', () => {
    const body = methodsParagraphs(slab).find((p) => p.heading === 'Mean-square displacement and diffusion')!.body;
    expect(body).toContain('in 2 dimensions (xy)');
    expect(body).toContain('MSD(t) = 2·2·D·t');
    expect(body).toContain('only along the periodic directions (x, y)');
    expect(body).toContain(note);
  });

  it('when g(r) was refused, then its paragraph says it was not computed and why, and the card says so in place of a number', () => {
    expect(methodsParagraphs(slab).find((p) => p.heading === 'Radial distribution function')!.body).toBe(`Not computed. ${refused}`);
    const card = headlineCards(slab.summary, 'a2PerPs').find((c) => c.id === 'coordination')!;
    expect(card.value).toBe('—');
    expect(card.warning).toBe(refused);
    const msd = headlineCards(slab.summary, 'a2PerPs').find((c) => c.id === 'msd')!;
    expect(msd.title).toBe('D from MSD (Einstein, along x, y)');
    expect(msd.detail).toContain(note);
  });
});
