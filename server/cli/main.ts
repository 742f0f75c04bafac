import { existsSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { ANALYSIS_KEYS, analysisKeySchema, DEFAULT_RDF_SPHERE_ATOMS, type AnalysisKey, type AnalysisParamsInput } from '../../shared/analysis-params.ts';
import { BOUNDARIES, LENGTH_UNITS, TIME_UNITS, VELOCITY_UNITS } from '../../shared/trajectory.ts';
import { analyzeFile, planFile, type AnalyzeFileOptions } from './analyze-file.ts';
import { printEstimate, printSummary } from './print-summary.ts';
import { readPotential } from './read-potential.ts';
import type { SpeciesElement } from '../../shared/trajectory.ts';
import { mergeParams, readParamsFile } from './read-params.ts';
import { ENERGY_UNIT_LIST } from '../../shared/energy-units.ts';

const USAGE = `Usage: ergodic analyze FILE [options]

Runs Ergodic's analysis engine on a local trajectory (XYZ, extended XYZ, PDB,
H5MD; plain, gzip or zip) and prints a summary, or writes the report JSON the
web API serves.

Options:
  --analyses LIST      comma-separated, from: ${ANALYSIS_KEYS.join(', ')}
                       (default: thermo,msd,vacf,vdos,rdf, and energy with --potential)
  --params FILE        every analysis setting as JSON: the same object as the web API's
                       "params" (or the whole request body {"analyses": [...], "params": {...}}),
                       checked by the same rules, e.g. {"binWidthA": 0.02, "fitWindow":
                       {"mode": "manual", "startPs": 1, "endPs": 5}, "species": ["O"]}.
                       The flags below that set a setting (--temperature, --r-max, --potential,
                       --file-energy, --ensemble, --drift-threshold, --from-frame, --to-frame,
                       --stride, --discard-ps, and --analyses for a whole body) may be added for
                       settings the file leaves out; the same setting in both is refused.
  --potential FILE     interaction model (JSON, see shared/interaction-model.ts), e.g.
                       {"pairs": [{"species": ["Ar","Ar"], "form": "lj", "epsilonEV": 0.0103236,
                       "sigmaA": 3.405, "cutoffA": 10.5}]}
  --ensemble E         NVE | NVT | NPT: chooses the fluctuation heat capacity
  --file-energy K[:U]  per-frame file key holding the potential energy, unit ${ENERGY_UNIT_LIST.join(' | ')} (default eV)
  --drift-threshold X  NVE drift threshold in k_B·T per atom per ns (default 0.01)
  --dt-ps X            time between frames in ps, when the file states none
  --temperature K      temperature for heat capacity (default: the kinetic temperature)
  --length-unit U      ${LENGTH_UNITS.join(' | ')} (default angstrom)
  --velocity-unit U    ${VELOCITY_UNITS.join(' | ')} (default angstrom/ps)
  --time-unit U        unit of times written in the file: ${TIME_UNITS.join(' | ')} (default ps)
  --boundary B         ${BOUNDARIES.join(' | ')} (default: periodic when the file has a cell)
  --r-max A            g(r) range in Å (default: half the shortest cell width, at most the
                       radius that holds about ${DEFAULT_RDF_SPHERE_ATOMS} atoms at the mean density)
  --from-frame N       first frame analysed, 0-based (default 0)
  --to-frame N         one past the last frame analysed (default: the end)
  --stride N           every N-th frame (default 1, more for runs above 100 000 frames)
  --discard-ps X       ps left out at the start of the range for equilibration
  --estimate           print the estimated time, memory and frames used, and stop
  --json OUT           write the report JSON to OUT ("-" for standard output)
  -h, --help           this text`;

function oneOf<T extends string>(value: string | undefined, allowed: readonly T[], flag: string): T | undefined {
  if (value === undefined) return undefined;
  if (!allowed.includes(value as T)) throw new Error(`${flag} must be one of ${allowed.join(', ')} (got "${value}")`);
  return value as T;
}

function count(value: string | undefined, flag: string, least: number): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!Number.isInteger(n) || n < least) throw new Error(`${flag} must be a whole number ≥ ${least} (got "${value}")`);
  return n;
}

function nonNegative(value: string | undefined, flag: string): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!(n >= 0) || !Number.isFinite(n)) throw new Error(`${flag} must be a number ≥ 0 (got "${value}")`);
  return n;
}

function positive(value: string | undefined, flag: string): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (!(n > 0) || !Number.isFinite(n)) throw new Error(`${flag} must be a positive number (got "${value}")`);
  return n;
}

/** Species whose element was not stated exactly, each with what the run used: the user must know, never silently. */
function assumedElements(elements: Record<string, SpeciesElement>, masses: Readonly<Record<string, number>>): string[] {
  return Object.entries(elements).filter(([label, e]) => e.status === 'assumed' && masses[label] === undefined && !(e.element && masses[e.element] !== undefined))
    .map(([label, e]) => `species "${label}" is taken as ${e.element} (${e.massU} u) from the element symbol its label starts with; if it is not, give its mass as "masses": {"${label}": …} in --params`);
}

export async function main(argv: string[]): Promise<number> {
  try {
    const { values, positionals } = parseArgs({
      args: argv, allowPositionals: true,
      options: {
        analyses: { type: 'string' }, 'dt-ps': { type: 'string' }, temperature: { type: 'string' },
        'length-unit': { type: 'string' }, 'velocity-unit': { type: 'string' }, 'time-unit': { type: 'string' },
        boundary: { type: 'string' }, 'r-max': { type: 'string' }, json: { type: 'string' }, help: { type: 'boolean', short: 'h' },
        potential: { type: 'string' }, ensemble: { type: 'string' }, 'file-energy': { type: 'string' }, 'drift-threshold': { type: 'string' },
        'from-frame': { type: 'string' }, 'to-frame': { type: 'string' }, stride: { type: 'string' }, 'discard-ps': { type: 'string' },
        estimate: { type: 'boolean' }, params: { type: 'string' },
      },
    });
    const [command, file, ...extra] = positionals;
    if (values.help || !command) {
      console.log(USAGE);
      return values.help ? 0 : 2;
    }
    if (command !== 'analyze') throw new Error(`unknown command "${command}"; the command is "analyze"`);
    if (!file) throw new Error('give the trajectory file: ergodic analyze FILE');
    if (extra.length) throw new Error(`unexpected arguments: ${extra.join(' ')}`);
    if (!existsSync(file)) throw new Error(`${file}: no such file`);
    const paramsFile = values.params !== undefined ? await readParamsFile(values.params) : undefined;
    if (paramsFile?.analyses && values.analyses !== undefined) throw new Error(`--analyses and --params ${values.params} both choose the analyses: give them in one place`);
    const interactionModel = values.potential !== undefined ? await readPotential(values.potential) : undefined;
    const [energyKey, energyUnit = 'eV'] = values['file-energy']?.split(':') ?? [];
    const fileQuantities = energyKey ? { potentialEnergy: { key: energyKey, unit: oneOf(energyUnit, ENERGY_UNIT_LIST, '--file-energy unit')! } } : undefined;
    const energyGiven = interactionModel || fileQuantities || paramsFile?.params.interactionModel || paramsFile?.params.fileQuantities;
    const defaults = energyGiven ? 'thermo,msd,vacf,vdos,rdf,energy' : 'thermo,msd,vacf,vdos,rdf';
    const analyses = paramsFile?.analyses ?? (values.analyses ?? defaults).split(',').map((k) => k.trim()).filter(Boolean).map((k) => {
      const parsed = analysisKeySchema.safeParse(k);
      if (!parsed.success) throw new Error(`unknown analysis "${k}"; choose from ${ANALYSIS_KEYS.join(', ')}`);
      return parsed.data;
    }) as AnalysisKey[];
    const timeUnit = oneOf(values['time-unit'], TIME_UNITS, '--time-unit') ?? 'ps';
    const dtPs = positive(values['dt-ps'], '--dt-ps');
    const flagParams = {
      temperatureK: { flag: '--temperature', value: positive(values.temperature, '--temperature') },
      rMaxA: { flag: '--r-max', value: positive(values['r-max'], '--r-max') },
      interactionModel: { flag: '--potential', value: interactionModel },
      fileQuantities: { flag: '--file-energy', value: fileQuantities },
      ensemble: { flag: '--ensemble', value: oneOf(values.ensemble, ['NVE', 'NVT', 'NPT'] as const, '--ensemble') },
      driftThresholdKTPerNs: { flag: '--drift-threshold', value: positive(values['drift-threshold'], '--drift-threshold') },
      fromFrame: { flag: '--from-frame', value: count(values['from-frame'], '--from-frame', 0) },
      toFrame: { flag: '--to-frame', value: count(values['to-frame'], '--to-frame', 1) },
      frameStride: { flag: '--stride', value: count(values.stride, '--stride', 1) },
      discardPs: { flag: '--discard-ps', value: nonNegative(values['discard-ps'], '--discard-ps') },
    };
    const params = paramsFile
      ? mergeParams(values.params!, paramsFile.params, flagParams)
      : Object.fromEntries(Object.entries(flagParams).map(([k, v]) => [k, v.value])) as AnalysisParamsInput;
    const options: AnalyzeFileOptions = {
      analyses,
      params,
      lengthUnit: oneOf(values['length-unit'], LENGTH_UNITS, '--length-unit') ?? 'angstrom',
      velocityUnit: oneOf(values['velocity-unit'], VELOCITY_UNITS, '--velocity-unit') ?? 'angstrom/ps',
      timeUnit: dtPs !== undefined ? 'ps' : timeUnit,
      timeStep: dtPs,
      boundary: oneOf(values.boundary, BOUNDARIES, '--boundary'),
    };
    if (values.estimate) {
      const { plan } = await planFile(file, options);
      printEstimate(plan);
      return 0;
    }
    const { report, speciesElements } = await analyzeFile(file, options);
    for (const line of assumedElements(speciesElements, options.params.masses ?? {})) console.error(`ergodic: note: ${line}`);
    const json = JSON.stringify(report, null, 2);
    if (values.json === '-') process.stdout.write(json + '\n');
    else {
      if (values.json) await writeFile(values.json, json + '\n');
      printSummary(report);
      if (values.json) console.log(`\nReport JSON written to ${values.json}`);
    }
    return 0;
  } catch (err) {
    console.error(`ergodic: ${err instanceof Error ? err.message : String(err)}`);
    return 1;
  }
}
