import { describe, expect, it } from 'vitest';
import { cutFileName } from '../../server/services/trajectory-frames.ts';

describe('the name of a downloaded cut', () => {
  it('when frames 0–2 (counted from 0) are cut, then the name gives them as the interface does, 1–3', () => {
    expect(cutFileName('argon.extxyz', 100, { from: 0, to: 3, stride: 1 })).toBe('argon-frames-1-3.extxyz');
  });

  it('when one frame is cut, then the name says frame, singular', () => {
    expect(cutFileName('quartz.xyz.gz', 100, { from: 41, to: 42, stride: 1 })).toBe('quartz-frame-42.extxyz');
  });

  it('when every 10th frame is taken, then the last number is the last frame taken, and the stride is named', () => {
    expect(cutFileName('melt.pdb', 100, { from: 0, to: 100, stride: 10 })).toBe('melt-frames-1-91-every-10.extxyz');
  });

  it('when the range runs past the end, then the name stops at the last frame there is', () => {
    expect(cutFileName('run.extxyz', 50, { from: 10, to: Number.MAX_SAFE_INTEGER, stride: 1 })).toBe('run-frames-11-50.extxyz');
    expect(cutFileName('.extxyz', 5, { from: 0, to: 5, stride: 1 })).toBe('trajectory-frames-1-5.extxyz');
  });
});
