import { tmpdir } from 'node:os';
import type { PlannedRun } from '../run-plan/plan-run.ts';
import type { LocalReport } from './analyze-file.ts';

const format = (v: unknown): string =>
  typeof v === 'number' ? (Number.isInteger(v) ? String(v) : Math.abs(v) >= 1e4 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(4) : v.toPrecision(5))
    : v === null || v === undefined ? '–' : String(v);

/** Nested headline values as indented `name: value` lines. */
function lines(value: unknown, indent: string, out: string[]): void {
  if (Array.isArray(value)) {
    value.forEach((item, i) => {
      if (item !== null && typeof item === 'object') {
        const label = (item as { label?: unknown }).label;
        out.push(`${indent}${label !== undefined ? String(label) : `#${i + 1}`}:`);
        lines(item, indent + '  ', out);
      } else out.push(`${indent}- ${format(item)}`);
    });
    return;
  }
  for (const [key, v] of Object.entries(value as Record<string, unknown>)) {
    if (key === 'label') continue;
    if (v !== null && typeof v === 'object') {
      out.push(`${indent}${key}:`);
      lines(v, indent + '  ', out);
    } else out.push(`${indent}${key}: ${format(v)}`);
  }
}

export function printSummary(report: LocalReport): void {
  const input = report.methods['input'] as { file: string; atoms: number; frames: number; format: string };
  const out = [
    `Ergodic ${report.engineVersion} — ${input.file} (${input.format}, ${input.atoms} atoms, ${input.frames} frames)`,
    `sha256 ${report.inputSha256}`,
  ];
  for (const key of report.analyses) {
    const summary = report.summary[key];
    if (!summary) continue;
    out.push('', `[${key}]`);
    lines(summary, '  ', out);
  }
  const discard = report.summary.thermo?.equilibrated === false ? report.summary.thermo.suggestedDiscardPs : null;
  if (discard) {
    const ps = Number(discard.toPrecision(3));
    out.push('', `The temperature drifts and settles after about ${ps} ps from the start of the range: run again with --discard-ps ${ps}.`);
  }
  out.push('', String(report.methods['caution'] ?? ''));
  console.log(out.join('\n'));
}

/** The plan of a run: the frames it would use and its estimated cost, one analysis a line. */
export function printEstimate({ selection, params, estimate }: PlannedRun): void {
  const seconds = (s: number) => (s < 90 ? `${s.toPrecision(2)} s` : s < 5400 ? `${(s / 60).toPrecision(2)} min` : `${(s / 3600).toPrecision(2)} h`);
  const out = [
    `frames ${selection.from}–${selection.to - 1}, every ${selection.stride}${selection.autoStride ? ' (chosen for a long run)' : ''}: ${selection.frames} used` +
      (selection.discardFrames ? `, ${selection.discardFrames} discarded for equilibration` : ''),
    `estimated time ${seconds(estimate.seconds)} (reading ${seconds(estimate.loadSeconds)}), peak memory about ${Math.round(estimate.memoryBytes / 1024 ** 2)} MiB` +
      (estimate.scratchBytes > 0 ? `, scratch file about ${Math.round(estimate.scratchBytes / 1024 ** 2)} MiB in ${tmpdir()}` : ''),
    ...estimate.analyses.map((a) => `  ${a.key.padEnd(10)} ${seconds(a.seconds)}`),
  ];
  if (params.rMaxA !== undefined) out.push(`g(r) range ${params.rMaxA} Å`);
  console.log(out.join('\n'));
}
