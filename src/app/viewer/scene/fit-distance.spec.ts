import { describe, expect, it } from 'vitest';
import { fitDistance } from './fit-distance';

/** Half the angle a sphere of radius r subtends from distance d: asin(r/d) (plain geometry). */
const halfAngleDeg = (r: number, d: number) => (Math.asin(r / d) * 180) / Math.PI;

describe('camera distance that shows the whole cell', () => {
  it('when the screen is wide, then the vertical field of view limits it and the sphere fills it with the margin', () => {
    const d = fitDistance(10, 50, 16 / 9, 1);
    expect(halfAngleDeg(10, d)).toBeCloseTo(25, 10);
  });

  it('when the screen is a portrait phone, then the narrower horizontal field of view limits it, so the sides are not cropped', () => {
    const aspect = 390 / 500;
    const d = fitDistance(10, 50, aspect, 1);
    const halfHorizontalDeg = (Math.atan(Math.tan((25 * Math.PI) / 180) * aspect) * 180) / Math.PI;
    expect(halfAngleDeg(10, d)).toBeCloseTo(halfHorizontalDeg, 10);
    expect(d).toBeGreaterThan(fitDistance(10, 50, 16 / 9, 1));
  });
});
