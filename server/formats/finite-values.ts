import { TrajectoryFormatError, type Frame, type TrajectoryFormat } from './frame.ts';

/** The largest magnitude a 32-bit float holds; frames are stored and served as Float32. */
export const FLOAT32_MAX = 3.4028234663852886e38;

const AXES = ['x', 'y', 'z'] as const;

/**
 * Refuses a frame holding a value that is not a finite number or that
 * would become infinite as a 32-bit float (1e39 reads as a number, and
 * turns into `inf` in the frame store and the viewer). The message names
 * the atom, the axis, the frame and, for XYZ files, the line.
 */
export function assertFiniteFrame(frame: Frame, where: { file: string; format: TrajectoryFormat; frameStartLine?: number }): void {
  const check = (values: ArrayLike<number> | undefined, what: string, lineOfAtom: (atom: number) => number | undefined) => {
    if (!values) return;
    for (let i = 0; i < values.length; i++) {
      const v = values[i]!;
      if (Number.isFinite(v) && Math.abs(v) <= FLOAT32_MAX) continue;
      const atom = Math.floor(i / 3);
      throw new TrajectoryFormatError(
        `atom ${atom + 1} has ${what} ${AXES[i % 3]} = ${v}, which is not a finite number a 32-bit float can hold (at most ±3.4e38)`,
        { file: where.file, frame: frame.index, line: lineOfAtom(atom) },
      );
    }
  };
  // In XYZ and extended XYZ a frame is a count line, a comment line, then one line per atom.
  const xyzLine = (atom: number) => (where.frameStartLine !== undefined && (where.format === 'xyz' || where.format === 'extxyz') ? where.frameStartLine + 2 + atom : undefined);
  check(frame.positions, 'position', xyzLine);
  check(frame.velocities, 'velocity', xyzLine);
  if (frame.cell) check(frame.cell, 'a cell vector component', () => (where.frameStartLine !== undefined && where.format === 'extxyz' ? where.frameStartLine + 1 : undefined));
}
