import { eq } from 'drizzle-orm';
import type { AppContext } from '../context.ts';
import { projectMembers, projects, users } from '../db/schema/index.ts';
import { hashPassword } from '../services/passwords.ts';
import { DEMO_ACCOUNTS, DEMO_PROJECTS } from './scenario.ts';

export interface SeededDemo {
  accounts: { role: string; email: string; password: string }[];
}

/**
 * Seeds the invented Larkspur Materials Lab once: its two accounts and two
 * projects. A second start finds the admin and leaves everything as it is.
 */
export async function seedDemo(ctx: AppContext, log: (m: string) => void): Promise<SeededDemo> {
  const accounts = DEMO_ACCOUNTS.map(({ role, email, password }) => ({ role, email, password }));
  const [existing] = await ctx.db.select({ id: users.id }).from(users).where(eq(users.email, DEMO_ACCOUNTS[0].email));
  if (existing) return { accounts };

  log('seeding the demo lab…');
  const ids: number[] = [];
  for (const account of DEMO_ACCOUNTS) {
    const [row] = await ctx.db.insert(users).values({
      email: account.email, displayName: account.displayName, role: account.siteRole,
      passwordHash: await hashPassword(account.password),
    }).$returningId();
    ids.push(row.id);
  }
  const [steward, student] = ids;
  for (const project of DEMO_PROJECTS) {
    const [row] = await ctx.db.insert(projects).values({
      name: project.name, description: project.description, createdBy: student, lastActivityAt: new Date(),
    }).$returningId();
    await ctx.db.insert(projectMembers).values([
      { projectId: row.id, userId: student, role: 'owner' },
      { projectId: row.id, userId: steward, role: 'viewer' },
    ]);
  }
  return { accounts };
}
