import type { ValidationErrors } from '@angular/forms';
import type { TrajectoryDto, TrajectoryMetadata } from '../../../shared/trajectory';

type Units = Required<Pick<TrajectoryMetadata, 'timeUnit' | 'lengthUnit' | 'velocityUnit' | 'boundary'>>;

/** The form's fields; null where a value is not stated, or left as each trajectory has it. */
export interface MetadataFormValues {
  name: string;
  temperatureK: number | null;
  ensemble: TrajectoryMetadata['ensemble'];
  timeStep: number | null;
  timeUnit: Units['timeUnit'] | null;
  lengthUnit: Units['lengthUnit'] | null;
  velocityUnit: Units['velocityUnit'] | null;
  boundary: Units['boundary'] | null;
  constraints: number | null;
  potential: string | null;
  engine: string | null;
  notes: string | null;
}

type Source = { kind: 'one'; trajectory: TrajectoryDto } | { kind: 'many'; trajectories: readonly TrajectoryDto[] } | { kind: 'upload' };

function valuesOf(t: TrajectoryDto): MetadataFormValues {
  return {
    name: t.name, temperatureK: t.temperatureK, ensemble: t.ensemble as MetadataFormValues['ensemble'], timeStep: t.timeStep,
    timeUnit: t.timeUnit as Units['timeUnit'], lengthUnit: t.lengthUnit as Units['lengthUnit'], velocityUnit: t.velocityUnit as Units['velocityUnit'],
    boundary: t.boundary as Units['boundary'], constraints: t.constraints, potential: t.potential, engine: t.engine, notes: t.notes,
  };
}

/** What a new upload is taken to have unless the user or the file says otherwise (the server's defaults). */
const UPLOAD_DEFAULTS: MetadataFormValues = {
  name: '', temperatureK: null, ensemble: null, timeStep: null, timeUnit: 'ps', lengthUnit: 'angstrom', velocityUnit: 'angstrom/ps',
  boundary: 'periodic', constraints: null, potential: '', engine: '', notes: '',
};

/**
 * Where the form starts: one trajectory's values; for several, each value
 * they share, and null (listed in `mixed`) where they differ; for uploads,
 * the server's defaults.
 */
export function initialValues(source: Source): { values: MetadataFormValues; mixed: Set<keyof MetadataFormValues> } {
  if (source.kind === 'one') return { values: valuesOf(source.trajectory), mixed: new Set() };
  if (source.kind === 'upload') return { values: { ...UPLOAD_DEFAULTS }, mixed: new Set() };
  const all = source.trajectories.map(valuesOf);
  const values = { ...all[0]! } as Record<keyof MetadataFormValues, unknown>;
  const mixed = new Set<keyof MetadataFormValues>();
  for (const key of Object.keys(values) as (keyof MetadataFormValues)[]) {
    if (key === 'name') continue;
    if (all.some((v) => v[key] !== all[0]![key])) {
      values[key] = null;
      mixed.add(key);
    }
  }
  values['name'] = '';
  return { values: values as unknown as MetadataFormValues, mixed };
}

const WORDS: Partial<Record<keyof MetadataFormValues, string>> = {
  temperatureK: 'A temperature must be above 0 K.',
  timeStep: 'The time between frames must be above 0.',
  constraints: 'Constraints are a whole number, 0 or more.',
};

/** The one sentence shown under a field whose value is refused. */
export function fieldProblems(field: keyof MetadataFormValues, errors: ValidationErrors | null): string {
  if (!errors) return '';
  if (errors['required']) return 'This is required.';
  return WORDS[field] ?? 'This value is not accepted.';
}
