import { Matrix4, Vector3 } from 'three';
import { describe, expect, it } from 'vitest';
import { initialiseScaledMatrices, writeTranslations } from './instance-matrices';

describe('instance matrices', () => {
  it('when initialised and translated, then each matrix equals three.js compose(position, identity, scale)', () => {
    const atoms = Uint32Array.from([2, 0]);
    const positions = Float32Array.from([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    const target = new Float32Array(2 * 16).fill(42);

    initialiseScaledMatrices(target, 2, 0.35);
    writeTranslations(target, atoms, positions);

    const expectFor = (j: number, atom: number) => {
      const expected = new Matrix4().makeScale(0.35, 0.35, 0.35).setPosition(new Vector3(...positions.slice(atom * 3, atom * 3 + 3)));
      Array.from(target.slice(j * 16, j * 16 + 16)).forEach((v, k) => expect(v).toBeCloseTo(expected.elements[k]!, 6));
    };
    expectFor(0, 2);
    expectFor(1, 0);
  });

  it('when a new frame arrives, then only the translations change', () => {
    const target = new Float32Array(16);
    initialiseScaledMatrices(target, 1, 2);
    writeTranslations(target, Uint32Array.from([0]), Float32Array.from([1, 1, 1]));
    const before = target.slice();
    writeTranslations(target, Uint32Array.from([0]), Float32Array.from([5, 6, 7]));
    const changed = Array.from(target).flatMap((v, k) => (v !== before[k] ? [k] : []));
    expect(changed).toEqual([12, 13, 14]);
  });
});
