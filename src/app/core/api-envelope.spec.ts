import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { unwrap } from './api-envelope';

describe('unwrap', () => {
  const project = z.object({ id: z.number(), name: z.string() });

  it('when the answer holds its value under the key, then the checked value comes out', () => {
    expect(unwrap('project', project)({ project: { id: 3, name: 'Argon melt' } })).toEqual({ id: 3, name: 'Argon melt' });
    expect(unwrap('projects', z.array(project))({ projects: [] })).toEqual([]);
  });

  it('when the key is missing, then the error names it', () => {
    expect(() => unwrap('project', project)({ id: 3, name: 'bare' })).toThrow(/no "project"/);
    expect(() => unwrap('project', project)(null)).toThrow(/no "project"/);
  });

  it('when the value has the wrong shape, then the error says where', () => {
    expect(() => unwrap('project', project)({ project: { id: 'three', name: 'x' } })).toThrow(/project\.id/);
  });

  it('when a parser function is given, then it reads the value', () => {
    expect(unwrap('n', (v) => Number(v) * 2)({ n: 21 })).toBe(42);
  });
});
