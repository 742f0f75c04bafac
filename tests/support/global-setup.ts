import type { TestProject } from 'vitest/node';
import { startTestStack } from '../../scripts/services/test-stack.ts';
import { loadConfig } from '../../server/config.ts';
import { connectDatabase } from '../../server/db/client.ts';
import { runMigrations } from '../../server/db/migrate.ts';

declare module 'vitest' {
  export interface ProvidedContext {
    stackEnv: Record<string, string>;
  }
}

/**
 * Integration tests run against real services. `npm test` starts them once
 * and passes their addresses in ERGODIC_STACK_ENV; run alone, this starts a
 * throw-away stack and stops it afterwards.
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const given = process.env['ERGODIC_STACK_ENV'];
  const stack = given ? { env: JSON.parse(given) as Record<string, string>, stop: async () => {} } : await startTestStack();
  const config = loadConfig({ ...process.env, ...stack.env });
  const database = connectDatabase(config.DATABASE_URL);
  await runMigrations(database.db);
  await database.close();
  project.provide('stackEnv', stack.env);
  return () => stack.stop();
}
