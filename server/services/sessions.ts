import type mysql from 'mysql2/promise';

/**
 * Signs a user out everywhere (after a password reset or when an admin
 * disables the account). The store keeps session data as JSON text, with
 * passport's user id at $.passport.user.
 */
export async function endSessionsOf(pool: mysql.Pool, userId: number): Promise<void> {
  await pool.query("DELETE FROM sessions WHERE JSON_VALUE(data, '$.passport.user') = ?", [String(userId)]);
}
