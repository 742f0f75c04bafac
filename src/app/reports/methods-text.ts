import type { ReportDto } from '../../../shared/report';
import type { ReportSummary } from '../../../shared/report-summary';
import { energyParagraph } from './energy-methods';
import { formatNumber } from './number-format';
import { flag, num, record, text, type Json } from './record-read';

/** One paragraph of the methods section, headed by the analysis it describes. */
export interface MethodsParagraph {
  heading: string;
  body: string;
}

const f = (x: number | null, digits = 4) => (x === null ? '?' : formatNumber(x, digits));
const span = (w: { start: number; end: number; source: string }) => `${f(w.start, 3)}–${f(w.end, 3)} ps (${w.source === 'auto' ? 'chosen automatically' : 'set by hand'})`;

/** True when every window was set by hand, so the text must not describe an automatic choice. */
const byHand = (windows: readonly { source: string }[]) => windows.length > 0 && windows.every((w) => w.source === 'manual');

const WINDOW_NAMES: Partial<Record<string, string>> = {
  hann: 'Hann window', blackman: 'Blackman window', gaussian: 'Gaussian window', lorch: 'Lorch window', none: 'no window',
};

function windowName(key: string | null): string {
  return key ? (WINDOW_NAMES[key] ?? `${key} window`) : 'default window';
}

function inputParagraph(report: ReportDto, input: Json): MethodsParagraph {
  const parts = [
    `${text(input, 'file') ?? report.trajectoryName}`,
    `SHA-256 ${text(input, 'sha256') ?? report.inputSha256 ?? 'not recorded'}`,
    `${f(num(input, 'atoms'), 12)} atoms, ${f(num(input, 'frames'), 12)} frames`,
  ];
  const step = num(input, 'timeStep');
  if (step !== null) parts.push(`time step between frames ${f(step)} ${text(input, 'timeUnit') ?? ''}`.trim());
  for (const [key, label] of [['ensemble', 'ensemble'], ['potential', 'potential'], ['engine', 'simulation engine']] as const) {
    const v = text(input, key);
    if (v) parts.push(`${label} ${v}`);
  }
  const lengthUnit = text(input, 'lengthUnit');
  if (lengthUnit) parts.push(`lengths read in ${lengthUnit}`);
  return { heading: 'Input', body: `Trajectory ${parts.join('; ')}.` };
}

/** 2 → "2nd", 13 → "13th", 21 → "21st". */
function ordinal(n: number): string {
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? 'th' : ['th', 'st', 'nd', 'rd'][n % 10] ?? 'th';
  return `${n}${suffix}`;
}

/**
 * Which frames the engine saw; absent from reports made before frames could be selected.
 * The report stores the API's range (0-based, `to` one past the end); readers count frames from 1, as the viewer does.
 */
function framesParagraph(m: Json): MethodsParagraph | null {
  const used = num(m, 'used');
  const from = num(m, 'from');
  const to = num(m, 'to');
  const stride = num(m, 'stride');
  if (used === null || from === null || to === null || stride === null) return null;
  const discarded = num(m, 'discardedFrames') ?? 0;
  const every = stride > 1 ? `, every ${ordinal(stride)} frame${flag(m, 'autoStride') ? ' (chosen automatically for a long run)' : ''}` : '';
  const discard = discarded > 0 ? ` The first ${f(num(m, 'discardPs'), 4)} ps of the range (${discarded} frames) were left out for equilibration.` : '';
  return { heading: 'Frames', body: `Analysed ${used} frames, from frame ${from + 1} up to frame ${to}${every}.${discard}` };
}

/** Warnings a reader must not miss, as sentences after a paragraph. */
const warned = (warnings: readonly string[] | undefined): string => (warnings?.length ? ` ${warnings.map((w) => `Warning: ${w}`).join(' ')}` : '');

function thermoParagraph(s: NonNullable<ReportSummary['thermo']>, m: Json): MethodsParagraph {
  const factor = num(m, 'differenceCorrection');
  const source = text(m, 'velocitySource') === 'stored-velocities' ? 'stored velocities'
    : `central differences of positions on the interior frames; finite differences read a mode's kinetic energy low by [sin(ωΔt)/(ωΔt)]², ` +
      `so the series was scaled by ${f(factor, 4)}, the ratio of the corrected to the raw velocity spectrum of the run`;
  return {
    heading: 'Temperature',
    body: `Instantaneous temperature from the kinetic energy by equipartition, T = 2K/(f·k_B), with f = ${s.degreesOfFreedomRule ?? s.degreesOfFreedom} degrees of freedom ` +
      `(3N − constraints − 3 with the centre-of-mass motion removed, unless given), from ${source}. ` +
      (s.statedTemperatureK ? `The simulation states ${f(s.statedTemperatureK)} K. ` : '') +
      `Errors of ensemble averages by Flyvbjerg–Petersen blocking (plateau at blocking level ${f(num(m, 'blockingPlateauLevel'), 3)}). ` +
      `Equilibration judged by comparing the first and last thirds of the run: ${s.equilibrated ? 'no significant drift' : 'a significant drift was found'}.` +
      (!s.equilibrated && s.suggestedDiscardPs ? ` By automated equilibration detection (Chodera 2016) the temperature settles after about ${f(s.suggestedDiscardPs, 3)} ps from the start of the range.` : '') +
      warned(s.warnings),
  };
}

/** How a standard error was found, for the methods text (SCIENCE item 30). */
function uncertaintyWords(method: string | undefined, blocks: number | undefined): string {
  const n = blocks ? `${blocks} ` : '';
  switch (method) {
    case 'atom-blocks': return `standard error from the spread of D over ${n}independent groups of atoms`;
    case 'time-blocks': return `standard error from the spread of D over ${n}independent blocks, each atom in consecutive stretches of the run (time origins)`;
    case 'fit-residuals': return 'uncertainty from the fit residuals';
    default: return 'no statistical error (too few atoms and too short a run for independent blocks)';
  }
}

function msdParagraph(s: NonNullable<ReportSummary['msd']>, m: Json, params: Json): MethodsParagraph {
  const fits = s.groups.map((g) => `${g.label}: ${span(g.fitWindowPs)}, ${uncertaintyWords(g.uncertaintyMethod, g.uncertaintyBlocks)}`);
  return {
    heading: 'Mean-square displacement and diffusion',
    body: `MSD by the FFT (Wiener–Khinchin) algorithm averaged over all time origins, on positions ${flag(m, 'unwrapped') === false ? 'as stored' : 'unwrapped across periodic boundaries'}` +
      `${flag(m, 'comDriftRemoved') ? ', centre-of-mass drift removed' : ''}, in ${s.dimensions} dimension${s.dimensions === 1 ? '' : 's'} (${s.components ?? text(params, 'components') ?? 'xyz'}). ` +
      `Self-diffusion coefficient from the Einstein relation, MSD(t) = 2·${s.dimensions}·D·t, by a least-squares line ${byHand(s.groups.map((g) => g.fitWindowPs)) ? 'over a window set by hand' : 'over the window where the log–log slope is near 1'} — ${fits.join('; ')}.` +
      (s.partlyPeriodic ? ` Positions are unwrapped and minimum-imaged only along the periodic directions (${[...s.partlyPeriodic.periodicAxes].join(', ')}); the MSD along each direction is given on its own. ${s.partlyPeriodic.note}` : ''),
  };
}

function vacfParagraph(s: NonNullable<ReportSummary['vacf']>, m: Json): MethodsParagraph {
  const source = s.velocitySource === 'stored-velocities' ? 'stored velocities'
    : 'central differences of unwrapped positions (which damp fast modes by sin(ωΔt)/(ωΔt), lowering the VACF at short lags but not its integral)';
  const windows = s.groups.map((g) => `${g.label}: ${span(g.plateauWindowPs)}${g.dStdError !== undefined ? `, ${uncertaintyWords(g.uncertaintyMethod, g.uncertaintyBlocks)}` : ''}`).join('; ');
  const errorNote = s.groups.some((g) => g.dStdError !== undefined)
    ? 'the spread of the running integral across the window measures how flat the plateau is and is not used as an error bar'
    : 'the quoted spread of the running integral there is not a standard error';
  return {
    heading: 'Velocity autocorrelation and Green–Kubo diffusion',
    body: `VACF ⟨v(0)·v(t)⟩ by FFT over all time origins from ${source}${flag(m, 'comDriftRemoved') ? ', centre-of-mass motion removed' : ''}. ` +
      `Green–Kubo integral D = (1/d)∫⟨v(0)·v(t)⟩dt, read as the mean of the running integral ${byHand(s.groups.map((g) => g.plateauWindowPs)) ? 'over a window set by hand' : 'over its plateau'} — ${windows}; ${errorNote}.`,
  };
}

/** Which temperature the harmonic quantities used, by the one rule: kinetic unless one was chosen, the stated one beside. */
function temperatureChoice(s: NonNullable<ReportSummary['vdos']>): string {
  const used = s.temperatureSource === 'chosen'
    ? `chosen for this analysis; the kinetic temperature was ${f(s.kineticTemperatureK ?? null)} K`
    : `the kinetic temperature of the spectrum with ${s.degreesOfFreedomRule ?? 'the counted'} degrees of freedom`;
  return s.statedTemperatureK ? `${used}; the simulation states ${f(s.statedTemperatureK)} K` : used;
}

function vdosParagraph(s: NonNullable<ReportSummary['vdos']>, m: Json, params: Json): MethodsParagraph {
  const dc = s.differenceCorrection;
  const correction = dc
    ? ` Velocities are central differences of positions, which damp a mode's power by [sin(ωΔt)/(ωΔt)]²; the spectrum was divided by that factor up to ` +
      `${f(dc.correctedUpToCm1)} cm⁻¹ (ωΔt = 3π/4), and ${f(100 * dc.uncorrectableFraction, 2)} % of its raw weight lay above, where nothing can be restored.`
    : '';
  const segments = num(m, 'segments');
  const averaged = segments !== null && segments > 1 ? `averaged over ${f(segments, 6)} half-overlapping segments of ${f(num(m, 'segmentFrames'), 12)} frames` : `over ${f(num(m, 'segmentFrames'), 12)} frames`;
  return {
    heading: 'Vibrational density of states',
    body: `VDOS as the mass-weighted power spectrum of the atoms' windowed velocities, S(ν) = (2/k_BT)·Σ m·|Σ_t w(t)·v(t)·e^{−2πiνt}|²·Δt/Σw², ` +
      `non-negative at every frequency (${windowName(text(m, 'window') ?? text(params, 'window'))}, ${averaged}, FFT length ${f(num(m, 'fftLength'), 12)}, ` +
      `bin ${f(num(m, 'binWidthThz'), 3)} THz), normalised to ${f(s.modes, 6)} modes; 1 THz = 33.356 cm⁻¹ = 4.1357 meV. ` +
      `Heat capacity, entropy and zero-point energy from the VDOS with quantum harmonic weights at ${f(s.temperatureK)} K (${temperatureChoice(s)}), beside the classical (Dulong–Petit) limit.` +
      (s.stdErrors ? ` Standard errors of the kinetic temperature, heat capacity, entropy, zero-point energy and peak positions from ${s.stdErrors.blocks} independent groups of atoms, each spectrum normalised to the same modes; peak positions add a tenth of a bin for the reading between samples.` : '') +
      `${correction}${text(m, 'thermoNote') ? ` ${text(m, 'thermoNote')}` : ''}${warned([...(s.temperatureWarning ? [s.temperatureWarning] : []), ...(s.warnings ?? [])])}`,
  };
}

function rdfParagraph(m: Json): MethodsParagraph {
  const refused = text(m, 'refused');
  if (refused) return { heading: 'Radial distribution function', body: `Not computed. ${refused}` };
  const how = text(m, 'method') === 'cell-list' ? 'cell lists' : 'all pairs';
  return {
    heading: 'Radial distribution function',
    body: `g(r) with the minimum-image convention and ${how}, out to r_max = ${f(num(m, 'rMaxA'))} Å in bins of ${f(num(m, 'binWidthA'))} Å over ${f(num(m, 'framesUsed'), 12)} frames, ` +
      `normalised by the ideal-gas shell count (${text(m, 'normalisation') ?? 'per-frame volume'}). Coordination numbers by integrating 4πρr²g(r) to the first minimum, per species pair ` +
      `(neighbours of the second species around one atom of the first). A first peak is reported only where g(r) stands five counting errors above 1 in a bin holding at least five independent pairs, ` +
      `and falls clearly after it; counts are weighed by the ${f(num(m, 'independentFrames'), 4)} frames that are independent configurations at the scale of three bins. Where nothing stands out, no shell and no coordination number are given.`,
  };
}

function sqParagraph(m: Json): MethodsParagraph {
  const refused = text(m, 'refused');
  if (refused) return { heading: 'Structure factor', body: `Not computed. ${refused}` };
  return {
    heading: 'Structure factor',
    body: `S(q) = 1 + 4πρ∫r²[g(r) − 1]·sin(qr)/(qr)·W(r)dr out to r_max = ${f(num(m, 'rMaxA'))} Å (${windowName(text(m, 'window'))}); reliable above q = ${f(num(m, 'qReliableFromInvA'), 3)} Å⁻¹.`,
  };
}

function lindemannParagraph(s: NonNullable<ReportSummary['lindemann']>, m: Json): MethodsParagraph {
  const form = text(m, 'form') ?? s.form;
  if (form === 'per-atom') {
    return {
      heading: 'Lindemann index',
      body: `Bulk form (a periodic cell): each atom's rms displacement about its mean position, δ_i = √⟨|u_i − ⟨u_i⟩|²⟩/r_nn, on unwrapped positions with the centre-of-mass drift removed, ` +
        `over ${f(num(m, 'framesUsed'), 12)} frames; the index is √(mean over atoms of ⟨|u − ⟨u⟩|²⟩)/r_nn with r_nn = ${f(num(m, 'nearestNeighbourA') ?? s.nearestNeighbourA ?? null)} Å, the first peak of the pair-distance distribution. ` +
        `It does not depend on the number of atoms. Melted above ${f(s.threshold, 2)} of the spacing (Lindemann's criterion).`,
    };
  }
  if (form === 'all-pairs') {
    return {
      heading: 'Lindemann index',
      body: `Cluster form (no periodic cell): relative fluctuation of every interatomic distance, q_i = (1/(N−1))Σ_j √(⟨r_ij²⟩ − ⟨r_ij⟩²)/⟨r_ij⟩, over ${f(num(m, 'pairs'), 12)} pairs, ` +
        `every ${f(num(m, 'frameStride'), 6)} frame(s) of ${f(num(m, 'framesUsed'), 12)}; melted above ${f(s.threshold, 2)} (the usual cluster criterion).`,
    };
  }
  const pairs = text(m, 'pairSet') === 'all-pairs' ? 'every pair of atoms' : 'neighbours in the first frame';
  return {
    heading: 'Lindemann index',
    body: `Relative fluctuation of interatomic distances over ${f(num(m, 'pairs'), 12)} pairs (${pairs}), every ${f(num(m, 'frameStride'), 6)} frame(s) of ${f(num(m, 'framesUsed'), 12)}; melted above ${f(s.threshold, 2)}.`,
  };
}

function ngpParagraph(m: Json): MethodsParagraph {
  return {
    heading: 'Non-Gaussian parameter',
    body: `α₂(t) = d·⟨Δr⁴⟩/((d+2)·⟨Δr²⟩²) − 1 (3⟨Δr⁴⟩/(5⟨Δr²⟩²) − 1 in 3-D) from unwrapped displacements, time origins every ${f(num(m, 'originStride'), 6)} frame(s), ` +
      'for each species separately: unlike atoms are never pooled, since a mixture of Gaussian walkers with different D is not Gaussian.',
  };
}

/** The methods section, written from the parameters and methods the engine recorded for this report. */
export function methodsParagraphs(report: ReportDto): MethodsParagraph[] {
  const s = report.summary;
  const m = report.methods;
  const params = report.params;
  const out = [inputParagraph(report, record(m, 'input'))];
  const frames = framesParagraph(record(m, 'frames'));
  if (frames) out.push(frames);
  if (s.thermo) out.push(thermoParagraph(s.thermo, record(m, 'thermo')));
  if (s.msd) out.push(msdParagraph(s.msd, record(m, 'msd'), params));
  if (s.vacf) out.push(vacfParagraph(s.vacf, record(m, 'vacf')));
  if (s.vdos) out.push(vdosParagraph(s.vdos, record(m, 'vdos'), params));
  if (s.rdf) out.push(rdfParagraph(record(m, 'rdf')));
  if (s.sq) out.push(sqParagraph(record(m, 'sq')));
  if (s.lindemann) out.push(lindemannParagraph(s.lindemann, record(m, 'lindemann')));
  if (s.ngp) out.push(ngpParagraph(record(m, 'ngp')));
  if (s.energy) out.push(energyParagraph(s.energy, record(m, 'energy')));
  out.push({
    heading: 'Software',
    body: `Computed with the Ergodic analysis engine ${report.engineVersion} on ${report.createdAt.slice(0, 10)}. Units: lengths in Å, times in ps, D in Å²/ps (1 Å²/ps = 10⁻⁸ m²/s = 10⁻⁴ cm²/s); physical constants from CODATA.`,
  });
  return out;
}

/** Paste-able plain text: headings and paragraphs, then the caution. */
export function methodsPlainText(paragraphs: readonly MethodsParagraph[], caution: string): string {
  return [...paragraphs.map((p) => `${p.heading}. ${p.body}`), caution].join('\n\n');
}
