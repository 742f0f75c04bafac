import { describe, expect, it } from 'vitest';
import { objectKeyFor } from '../../server/storage/object-keys.ts';

describe('object keys for uploads', () => {
  it.each([
    ['../../etc/passwd', /\/passwd$/],
    ['C:\\runs\\argon.xyz', /\/argon.xyz$/],
    ['run 1 (final).xyz.gz', /\/run_1_final_.xyz.gz$/],
    ['..', /\/trajectory$/],
    ['тест.pdb', /\/_.pdb$/],
  ])('when the file is named %j, then the key stays inside the project prefix with a tame name', (name, tail) => {
    const key = objectKeyFor(7, name);
    expect(key).toMatch(/^projects\/7\/trajectories\/[0-9a-f-]{36}\//);
    expect(key).toMatch(tail);
    expect(key.split('/').filter((part) => part === '..' || part === '.')).toEqual([]);
  });
});
