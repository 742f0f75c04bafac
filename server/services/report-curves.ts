import { gunzipSync, gzipSync, strFromU8, strToU8 } from 'fflate';
import type { Curve } from '../analysis/index.ts';

/** Curves as stored and served: plain number arrays, one per column. */
export interface StoredCurve {
  columns: string[];
  units: string[];
  data: number[][];
}

export function encodeCurves(curves: Record<string, Curve>): Uint8Array {
  return gzipSync(strToU8(JSON.stringify(storedCurves(curves))), { level: 6 });
}

/** Curves exactly as the API serves them once stored (NaN and ±Infinity as null), without the compression. */
export function storedCurves(curves: Record<string, Curve>): Record<string, StoredCurve> {
  const plain: Record<string, StoredCurve> = {};
  for (const [name, c] of Object.entries(curves)) {
    plain[name] = { columns: c.columns, units: c.units, data: c.data.map((col) => Array.from(col, finiteOrNull) as number[]) };
  }
  return plain;
}

export function decodeCurves(bytes: Uint8Array): Record<string, StoredCurve> {
  return JSON.parse(strFromU8(gunzipSync(bytes))) as Record<string, StoredCurve>;
}

/** JSON has no NaN or Infinity; an undefined point is written as null. */
function finiteOrNull(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

/** CSV with a header row of "column (unit)" names. */
export function curveToCsv(curve: StoredCurve): string {
  const quote = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  const header = curve.columns.map((c, i) => quote(curve.units[i] && curve.units[i] !== '1' ? `${c} (${curve.units[i]})` : c)).join(',');
  const rows = curve.data[0]?.length ?? 0;
  const lines = [header];
  for (let r = 0; r < rows; r++) lines.push(curve.data.map((col) => (col[r] === null || col[r] === undefined ? '' : String(col[r]))).join(','));
  return lines.join('\n') + '\n';
}
