/**
 * `--potential MODEL.json`: reads an interaction model from a file. A
 * tabulated pair may name its table as "csvFile" (r in Å and U per line,
 * path relative to the model file) instead of listing "points".
 */
import { readFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { parseInteractionModel, parseTableCsv, type InteractionModel } from '../../shared/interaction-model.ts';

export async function readPotential(path: string): Promise<InteractionModel> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new Error(`--potential ${path}: no such file`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    throw new Error(`--potential ${path}: not JSON (${err instanceof Error ? err.message : String(err)})`);
  }
  const pairs = (json as { pairs?: unknown })?.pairs;
  if (Array.isArray(pairs)) {
    for (const [i, pair] of pairs.entries()) {
      if (!pair || typeof pair !== 'object' || !('csvFile' in pair)) continue;
      const { csvFile, ...rest } = pair as { csvFile: unknown } & Record<string, unknown>;
      if (typeof csvFile !== 'string') throw new Error(`--potential ${path}: pairs[${i}].csvFile must be a file name`);
      const tablePath = resolve(dirname(path), csvFile);
      const csv = parseTableCsv(await readFile(tablePath, 'utf8').catch(() => {
        throw new Error(`--potential ${path}: pairs[${i}].csvFile ${tablePath}: no such file`);
      }));
      if (!csv.ok) throw new Error(`--potential ${path}: pairs[${i}].csvFile ${csvFile}, ${csv.issue}`);
      pairs[i] = { ...rest, points: csv.points };
    }
  }
  const parsed = parseInteractionModel(json);
  if (!parsed.ok) throw new Error(`--potential ${path} is not a valid interaction model:\n  ${parsed.issues.join('\n  ')}`);
  return parsed.model;
}
