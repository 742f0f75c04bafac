import mysql from 'mysql2/promise';

function databaseUrl(): string {
  const env = process.env['ERGODIC_STACK_ENV'];
  if (!env) throw new Error('ERGODIC_STACK_ENV is not set: run end-to-end tests with `npm test -- e2e`.');
  const url = (JSON.parse(env) as Record<string, string>)['DATABASE_URL'];
  if (!url) throw new Error('ERGODIC_STACK_ENV has no DATABASE_URL');
  return url;
}

/**
 * Makes an account a site admin directly in the test stack's database: only
 * the first account of an instance is made admin by the app, and which test
 * signs up first depends on the order files run in.
 */
export async function makeSiteAdmin(email: string): Promise<void> {
  const connection = await mysql.createConnection({ uri: databaseUrl() });
  try {
    const [result] = await connection.execute('UPDATE users SET role = ? WHERE email = ?', ['admin', email]);
    if ((result as { affectedRows: number }).affectedRows !== 1) throw new Error(`no account ${email} to make admin`);
  } finally {
    await connection.end();
  }
}
