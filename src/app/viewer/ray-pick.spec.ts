import { describe, expect, it } from 'vitest';
import { nearestSphereHit, type PickRay } from './ray-pick';

const along = (x: number, y: number, z: number): PickRay => ({ origin: { x: 0, y: 0, z: -10 }, direction: { x, y, z } });
const positions = Float32Array.from([
  0, 0, 0, // atom 0, on the axis
  0, 0, 5, // atom 1, on the axis behind atom 0
  0.9, 0, 0, // atom 2, beside atom 0
  0, 0, -20, // atom 3, behind the ray's origin
]);

describe('nearestSphereHit', () => {
  it('when two spheres lie on the ray, then the nearer one is hit at its surface', () => {
    const hit = nearestSphereHit(along(0, 0, 1), positions, Uint32Array.from([1, 0]), 0.5);
    expect(hit).toEqual({ atom: 0, distance: 9.5 });
  });

  it('when only listed atoms count, then a hidden nearer one is passed through', () => {
    expect(nearestSphereHit(along(0, 0, 1), positions, Uint32Array.from([1]), 0.5)?.atom).toBe(1);
  });

  it('when the ray passes beside a sphere by more than its radius, then it misses', () => {
    expect(nearestSphereHit(along(0, 0, 1), positions, Uint32Array.from([2]), 0.5)).toBeNull();
    expect(nearestSphereHit(along(0, 0, 1), positions, Uint32Array.from([2]), 1)?.atom).toBe(2);
  });

  it('when a sphere is behind the origin, then it is not picked', () => {
    expect(nearestSphereHit(along(0, 0, 1), positions, Uint32Array.from([3]), 0.5)).toBeNull();
  });
});
