import { describe, expect, it } from 'vitest';
import { configToEnv, loadConfig } from '../../server/config.ts';

describe('configuration', () => {
  it('when nothing is set, then local development defaults apply', () => {
    const config = loadConfig({});
    expect(config.PORT).toBe(4300);
    expect(config.UPLOAD_MAX_BYTES).toBe(2 * 1024 ** 3);
  });

  it('when values are wrong, then start-up fails naming every bad variable', () => {
    expect(() => loadConfig({ PORT: 'abc', DATABASE_URL: 'postgres://x' })).toThrow(/PORT[\s\S]*DATABASE_URL: must start with mysql:\/\//);
  });

  it('when a resolved configuration is written back as environment, then a child process resolves exactly the same settings', () => {
    const config = loadConfig({ PORT: '4411', SMTP_SECURE: 'true', RUN_WORKER: 'off', PUBLIC_URL: 'https://lab.example', WORKER_SHUTDOWN_GRACE_MS: '0' });
    expect(loadConfig(configToEnv(config))).toEqual(config);
  });

  it('when RUN_WORKER has its older spelling, then true means a worker process and false means none', () => {
    expect(loadConfig({}).RUN_WORKER).toBe('process');
    expect(loadConfig({ RUN_WORKER: 'true' }).RUN_WORKER).toBe('process');
    expect(loadConfig({ RUN_WORKER: 'false' }).RUN_WORKER).toBe('off');
    expect(() => loadConfig({ RUN_WORKER: 'sometimes' })).toThrow(/RUN_WORKER/);
  });
});
