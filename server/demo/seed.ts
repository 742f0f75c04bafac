import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { AppContext } from '../context.ts';
import { projectMembers, projects, trajectories, users } from '../db/schema/index.ts';
import { startRun } from '../services/analysis-runs.ts';
import { hashPassword } from '../services/passwords.ts';
import { registerStoredFile } from '../services/trajectories.ts';
import { objectKeyFor } from '../services/upload-to-store.ts';
import { DEMO_TRAJECTORIES, toExtxyzBytes } from './demo-trajectories.ts';
import { DEMO_ACCOUNTS, DEMO_PROJECTS, DEMO_SERIES } from './scenario.ts';
import { createSeries } from '../services/series/series.ts';
import { interactionModelSchema } from '../../shared/interaction-model.ts';

export interface SeededDemo {
  accounts: { role: string; email: string; password: string }[];
  /** Resolves when the demo runs are uploaded and their analyses queued. */
  ready: Promise<void>;
}

/**
 * Seeds the invented Larkspur Materials Lab once: two accounts, two projects,
 * trajectories simulated on the spot and analyses run by the real engine.
 * A second start finds the admin and leaves everything as it is.
 */
export async function seedDemo(ctx: AppContext, log: (m: string) => void): Promise<SeededDemo> {
  const accounts = DEMO_ACCOUNTS.map(({ role, email, password }) => ({ role, email, password }));
  const [existing] = await ctx.db.select({ id: users.id }).from(users).where(eq(users.email, DEMO_ACCOUNTS[0].email));
  if (existing) return { accounts, ready: Promise.resolve() };

  log('seeding the demo lab…');
  const ids: number[] = [];
  for (const account of DEMO_ACCOUNTS) {
    const [row] = await ctx.db.insert(users).values({
      email: account.email, displayName: account.displayName, role: account.siteRole,
      passwordHash: await hashPassword(account.password),
    }).$returningId();
    ids.push(row.id);
  }
  const [steward, student] = ids as [number, number];
  const projectIds = new Map<string, number>();
  for (const project of DEMO_PROJECTS) {
    const [row] = await ctx.db.insert(projects).values({
      name: project.name, description: project.description, createdBy: student, lastActivityAt: new Date(),
      interactionModel: 'interactionModel' in project ? interactionModelSchema.parse(project.interactionModel) : null,
    }).$returningId();
    projectIds.set(project.name, row.id);
    await ctx.db.insert(projectMembers).values([
      { projectId: row.id, userId: student, role: 'owner' },
      { projectId: row.id, userId: steward, role: 'viewer' },
    ]);
  }
  const ready = seedRuns(ctx, student, projectIds, log);
  return { accounts, ready };
}

async function seedRuns(ctx: AppContext, userId: number, projectIds: Map<string, number>, log: (m: string) => void): Promise<void> {
  const ready = new Map<string, number>();
  for (const demo of DEMO_TRAJECTORIES) {
    const projectId = projectIds.get(demo.project)!;
    const bytes = await toExtxyzBytes(demo.simulate());
    const objectKey = objectKeyFor(projectId, demo.fileName);
    await ctx.store.putBytes(objectKey, bytes, 'text/plain');
    const stored = { objectKey, sizeBytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex') };
    const trajectory = await registerStoredFile(ctx, projectId, userId, demo.fileName, stored, { ...demo.metadata, timeUnit: 'ps' });
    const status = await waitUntilInspected(ctx, trajectory.id);
    if (status !== 'ready') {
      log(`demo trajectory ${demo.fileName} is ${status}; skipping its analyses`);
      continue;
    }
    await startRun(ctx, trajectory.id, userId, demo.analyses, {});
    ready.set(demo.fileName, trajectory.id);
    log(`demo trajectory ${demo.fileName} uploaded; analyses queued`);
  }
  // The series starts no runs of its own: the runs just queued have its settings, so it waits for them.
  for (const demo of DEMO_SERIES) {
    const trajectoryIds = demo.files.map((f) => ready.get(f)).filter((id): id is number => id !== undefined);
    if (trajectoryIds.length < 2) continue;
    await createSeries(ctx, projectIds.get(demo.project)!, userId, { name: demo.name, trajectoryIds });
    log(`demo series "${demo.name}" made`);
  }
}

async function waitUntilInspected(ctx: AppContext, id: number, timeoutMs = 120_000): Promise<string> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const [row] = await ctx.db.select({ status: trajectories.status }).from(trajectories).where(eq(trajectories.id, id));
    if (!row || row.status === 'ready' || row.status === 'failed' || Date.now() > deadline) return row?.status ?? 'deleted';
    await new Promise((r) => setTimeout(r, 250));
  }
}
