/** Reads from a JSON object of unknown shape without trusting it. */
export type Json = Record<string, unknown>;

export function record(from: unknown, key: string): Json {
  const v = isRecord(from) ? from[key] : undefined;
  return isRecord(v) ? v : {};
}

export function text(from: unknown, key: string): string | null {
  const v = isRecord(from) ? from[key] : undefined;
  return typeof v === 'string' && v.length > 0 ? v : null;
}

export function num(from: unknown, key: string): number | null {
  const v = isRecord(from) ? from[key] : undefined;
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

export function flag(from: unknown, key: string): boolean | null {
  const v = isRecord(from) ? from[key] : undefined;
  return typeof v === 'boolean' ? v : null;
}

export function isRecord(v: unknown): v is Json {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}
