/**
 * Extended XYZ output for downloading a cut of a trajectory. Numbers are
 * written in JS shortest round-trip form, so reading the file back gives
 * the exact same values.
 */
import type { Frame } from './frame.ts';

/** Property name velocities are written under. */
export const VELOCITY_PROPERTY = 'velocity';

/** Output is handed on in pieces about this size. */
const CHUNK_CHARS = 256 * 1024;

export async function* writeExtxyz(frames: AsyncIterable<Frame> | Iterable<Frame>): AsyncGenerator<Uint8Array> {
  let pending = '';
  for await (const frame of frames) {
    pending += frameHeader(frame);
    const { positions, velocities, species } = frame;
    const n = species.length;
    if (positions.length !== 3 * n || (velocities && velocities.length !== 3 * n)) {
      throw new RangeError(`frame ${frame.index + 1}: ${n} species but ${positions.length / 3} positions`);
    }
    for (let a = 0; a < n; a++) {
      const k = 3 * a;
      let line = `${species[a]} ${num(positions[k])} ${num(positions[k + 1])} ${num(positions[k + 2])}`;
      if (velocities) line += ` ${num(velocities[k])} ${num(velocities[k + 1])} ${num(velocities[k + 2])}`;
      pending += `${line}\n`;
      if (pending.length >= CHUNK_CHARS) {
        yield Buffer.from(pending, 'utf8');
        pending = '';
      }
    }
  }
  if (pending) yield Buffer.from(pending, 'utf8');
}

/** String(-0) is "0"; the sign of zero is kept so a cut reads back bit-identical. */
function num(x: number): string {
  return x === 0 && 1 / x < 0 ? '-0' : String(x);
}

function frameHeader(frame: Frame): string {
  for (const s of frame.species) {
    if (!/^\S+$/.test(s)) throw new RangeError(`frame ${frame.index + 1}: species label "${s}" is empty or contains whitespace`);
  }
  const parts: string[] = [];
  if (frame.cell) parts.push(`Lattice="${Array.from(frame.cell).join(' ')}"`);
  // Velocities (Å/ps) go under the plain word, a name of Ergodic's own choosing that its reader also takes.
  parts.push(`Properties=species:S:1:pos:R:3${frame.velocities ? `:${VELOCITY_PROPERTY}:R:3` : ''}`);
  if (frame.time !== undefined) parts.push(`Time=${frame.time}`);
  if (frame.step !== undefined) parts.push(`Step=${frame.step}`);
  if (frame.pbc) parts.push(`pbc="${frame.pbc.map((p) => (p ? 'T' : 'F')).join(' ')}"`);
  // Per-frame numbers (energies, pressure…) travel with the frames they belong to.
  for (const [key, value] of Object.entries(frame.values ?? {})) {
    if (/^[A-Za-z_][\w-]*$/.test(key) && Number.isFinite(value)) parts.push(`${key}=${value}`);
  }
  return `${frame.species.length}\n${parts.join(' ')}\n`;
}
