/**
 * `--params PARAMS.json`: the analysis settings as the API takes them (the
 * `params` of POST /api/trajectories/:id/analyses, or that whole request
 * body), checked by the same shared schema, so a scripted run reproduces a
 * browser run exactly. Flags that set one of these fields may be given
 * beside the file only for fields the file leaves out: the same field from
 * both is refused, so no run silently uses a value its author did not mean.
 */
import { readFile } from 'node:fs/promises';
import { z } from 'zod';
import { analysisParamsSchema, type AnalysisKey, type AnalysisParamsInput } from '../../shared/analysis-params.ts';
import { startAnalysisSchema } from '../../shared/analysis-run.ts';

export interface ParamsFile {
  params: Record<string, unknown>;
  /** The analyses, when the file is a whole request body. */
  analyses?: AnalysisKey[];
}

/** The keys the shared schema knows; a file key outside them is a typo, not a setting. */
const KNOWN_KEYS = new Set(Object.keys(analysisParamsSchema.shape));

function issuesOf(error: z.ZodError, prefix: string): string {
  return error.issues.map((i) => `${[prefix, ...i.path.map(String)].filter(Boolean).join('.') || '(top level)'}: ${i.message}`).join('\n  ');
}

/** The API drops keys it does not know; a script's typo must not silently fall back to a default, so here they are refused. */
function refuseUnknown(path: string, record: Record<string, unknown>, prefix: string): void {
  const unknown = Object.keys(record).filter((k) => !KNOWN_KEYS.has(k));
  if (unknown.length) throw new Error(`--params ${path}: unknown setting${unknown.length > 1 ? 's' : ''} ${unknown.map((k) => `"${prefix}${k}"`).join(', ')}; the settings are ${[...KNOWN_KEYS].join(', ')}`);
}

/** Reads and checks a params file; errors name the file and the field. */
export async function readParamsFile(path: string): Promise<ParamsFile> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new Error(`--params ${path}: no such file`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    throw new Error(`--params ${path}: not JSON (${err instanceof Error ? err.message : String(err)})`);
  }
  if (!json || typeof json !== 'object' || Array.isArray(json)) throw new Error(`--params ${path}: must hold a JSON object of analysis settings`);
  const record = json as Record<string, unknown>;
  // A whole request body ({analyses, params, notes}) is taken as the API takes it.
  if ('params' in record || 'analyses' in record) {
    const parsed = startAnalysisSchema.safeParse(record);
    if (!parsed.success) throw new Error(`--params ${path} is not a valid analysis request:\n  ${issuesOf(parsed.error, '')}`);
    const params = (record.params ?? {}) as Record<string, unknown>;
    refuseUnknown(path, params, 'params.');
    return { params, analyses: parsed.data.analyses };
  }
  refuseUnknown(path, record, '');
  const parsed = analysisParamsSchema.safeParse(record);
  if (!parsed.success) throw new Error(`--params ${path} has invalid settings:\n  ${issuesOf(parsed.error, '')}`);
  return { params: record };
}

/**
 * The file's settings with the flags' settings added. A field set by both is
 * refused, naming the flag and the field; the result is checked once more by
 * the shared schema (a flag may combine badly with the file, e.g. rMaxA
 * against binWidthA).
 */
export function mergeParams(path: string, file: Record<string, unknown>, flags: Record<string, { flag: string; value: unknown }>): AnalysisParamsInput {
  const merged: Record<string, unknown> = { ...file };
  for (const [field, { flag, value }] of Object.entries(flags)) {
    if (value === undefined) continue;
    if (file[field] !== undefined) throw new Error(`${flag} and --params ${path} both set ${field}: give it in one place`);
    merged[field] = value;
  }
  const parsed = analysisParamsSchema.safeParse(merged);
  if (!parsed.success) throw new Error(`--params ${path} with the flags given is invalid:\n  ${issuesOf(parsed.error, '')}`);
  return merged as AnalysisParamsInput;
}
