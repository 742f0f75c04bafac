import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config.ts';

describe('configuration', () => {
  it('when nothing is set, then local development defaults apply', () => {
    const config = loadConfig({});
    expect(config.PORT).toBe(4300);
    expect(config.UPLOAD_MAX_BYTES).toBe(2 * 1024 ** 3);
  });

  it('when values are wrong, then start-up fails naming every bad variable', () => {
    expect(() => loadConfig({ PORT: 'abc', DATABASE_URL: 'postgres://x' })).toThrow(/PORT[\s\S]*DATABASE_URL: must start with mysql:\/\//);
  });
});
