import { createConnection } from 'mysql2/promise';

/**
 * Set-up the browser cannot do on its own in a test: the first account of
 * an instance is its admin, and which one that is depends on test order; a
 * second owner needs an e-mailed invitation. Written straight to the test
 * database that `npm test -- e2e` started.
 */
async function withDatabase<T>(work: (run: (sql: string, values: (string | number)[]) => Promise<unknown>) => Promise<T>): Promise<T> {
  const env = process.env['ERGODIC_STACK_ENV'];
  if (!env) throw new Error('ERGODIC_STACK_ENV is not set: run end-to-end tests with `npm test -- e2e`.');
  const url = (JSON.parse(env) as Record<string, string>)['DATABASE_URL'];
  if (!url) throw new Error('ERGODIC_STACK_ENV has no DATABASE_URL');
  const connection = await createConnection(url);
  try {
    return await work(async (sql, values) => (await connection.execute(sql, values))[0]);
  } finally {
    await connection.end();
  }
}

export function makeSiteAdmin(email: string): Promise<void> {
  return withDatabase(async (run) => {
    await run(`UPDATE users SET role = 'admin' WHERE email = ?`, [email]);
  });
}

export function addProjectOwner(projectId: number, email: string): Promise<void> {
  return withDatabase(async (run) => {
    await run(`INSERT INTO project_members (project_id, user_id, role) SELECT ?, id, 'owner' FROM users WHERE email = ?`, [projectId, email]);
  });
}
