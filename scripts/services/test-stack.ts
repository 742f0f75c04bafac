import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startStack, type RunningStack } from './stack.ts';
import { freePort } from './wait-for-port.ts';

/** A throw-away stack on free loopback ports, removed again on stop. */
export async function startTestStack(log: (m: string) => void = () => {}): Promise<RunningStack> {
  const dataDir = mkdtempSync(join(tmpdir(), 'ergodic-test-'));
  const ports = { db: await freePort(), redis: await freePort(), s3: await freePort(), smtp: await freePort() };
  try {
    const stack = await startStack({ dataDir, ports, persistent: false, dbPassword: 'ergodic-test', log });
    return {
      env: { ...stack.env, SESSION_SECRET: 'ergodic-test-session-secret-0123456789', NODE_ENV: 'test', LOG_LEVEL: 'warn',
        // Suites sign up hundreds of accounts from one address; the rate-limit tests set their own factor.
        RATE_LIMIT_FACTOR: '1000' },
      async stop() {
        await stack.stop();
        rmSync(dataDir, { recursive: true, force: true });
      },
    };
  } catch (err) {
    rmSync(dataDir, { recursive: true, force: true });
    throw err;
  }
}
