/** The signed-in person, as GET /api/auth/me returns it. */
export interface SignedInUser {
  id: number;
  email: string;
  displayName: string;
  /** Site role: admins manage accounts; project rights come from project roles. */
  role: 'admin' | 'member';
}
