import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, projects, reports, series, trajectories, users } from '../../server/db/schema/index.ts';
import { getLinkedSeries } from '../../server/services/series/series.ts';
import { seedDemo } from '../../server/demo/seed.ts';
import { DEMO_ACCOUNTS, DEMO_PROJECTS, DEMO_SERIES } from '../../server/demo/scenario.ts';
import { DEMO_ARGON_MODEL } from '../../server/demo/demo-trajectories.ts';
import { interactionModelSchema } from '../../shared/interaction-model.ts';
import { startWorker, type RunningWorker } from '../../server/jobs/worker.ts';
import { createTestApp } from '../support/test-app.ts';

const testApp = createTestApp();
const { ctx } = testApp;
let worker: RunningWorker;

beforeAll(async () => {
  worker = await startWorker(testApp.config, ctx.log);
});
afterAll(async () => {
  await worker.close();
  await testApp.close();
});

describe('the demo lab seed', () => {
  it('when seeded on an empty database, then the lab, its runs and engine-computed reports appear, and a second seed changes nothing', async () => {
    const demo = await seedDemo(ctx, () => {});
    expect(demo.accounts.map((a) => a.email)).toEqual(DEMO_ACCOUNTS.map((a) => a.email));
    await demo.ready;

    // Other test files share this database: look only at the lab's own rows.
    const labProjects = await ctx.db.select().from(projects).where(inArray(projects.name, DEMO_PROJECTS.map((p) => p.name)));
    const labIds = labProjects.map((p) => p.id);
    const labRuns = () => ctx.db.select().from(analysisRuns).where(inArray(analysisRuns.projectId, labIds));
    const deadline = Date.now() + 240_000;
    let runs = await labRuns();
    while (runs.some((r) => r.status === 'queued' || r.status === 'running') && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
      runs = await labRuns();
    }
    expect(runs.map((r) => [r.status, r.error])).toEqual(runs.map(() => ['done', null]));
    expect(await ctx.db.select().from(trajectories).where(inArray(trajectories.projectId, labIds))).toHaveLength(4);

    const byFile = new Map<string, (typeof reports.$inferSelect)>();
    for (const r of await ctx.db.select({ r: reports, name: trajectories.name }).from(reports).innerJoin(trajectories, eq(trajectories.id, reports.trajectoryId)).where(inArray(reports.projectId, labIds))) {
      byFile.set(r.name, r.r);
    }
    // The solid sits below the Lindemann threshold and the liquids above it
    // (Lindemann criterion, ~0.1; COMMON PRACTICE), so the demo shows a melting signature.
    const lindemannOf = (file: string) => (byFile.get(file)!.summary as { lindemann: { melted: boolean } }).lindemann.melted;
    expect(lindemannOf('argon-like-40K-solid.extxyz')).toBe(false);
    expect(lindemannOf('argon-like-90K-liquid.extxyz')).toBe(true);
    expect(lindemannOf('argon-like-130K-hot-liquid.extxyz')).toBe(true);

    // The argon runs carry their LJ model (the project's) and the energies their integrator wrote; the analysis
    // recomputes them from the model and finds the file agreeing, in an NVE run, with a conservation check.
    for (const file of ['argon-like-40K-solid.extxyz', 'argon-like-90K-liquid.extxyz', 'argon-like-130K-hot-liquid.extxyz']) {
      const energy = (byFile.get(file)!.summary as { energy: { sources: { potential: string }; potentialPerAtomEV: { mean: number; stdError: number }; pressureBar: { mean: number }; comparisons: { agree: boolean }[]; nveCheck: { status: string } | null; heatCapacity: unknown } }).energy;
      expect(energy.sources.potential).toBe('model');
      expect(energy.potentialPerAtomEV.mean).toBeLessThan(0);
      expect(Number.isFinite(energy.pressureBar.mean)).toBe(true);
      expect(energy.comparisons.map((c) => c.agree)).toEqual([true]);
      expect(energy.nveCheck).not.toBeNull();
      // The report keeps the model it used, and its pressure card says where the pressure came from.
      expect((byFile.get(file)!.params as { interactionModel?: unknown }).interactionModel).toEqual(interactionModelSchema.parse(DEMO_ARGON_MODEL));
      expect((energy as { pressureNote?: string }).pressureNote).toMatch(/^Shown: the virial pressure and its tensor from the interaction model/);
    }

    // The diatomics do not rotate: stated with 2 constraints per molecule they read their 300 K
    // (a 64-molecule canonical sample, so within 5 %), not the 196 K that 3N − 3 would give.
    const diatomics = (byFile.get('model-diatomics-300K.extxyz')!.summary as { thermo: { temperatureK: { mean: number }; degreesOfFreedom: number } }).thermo;
    expect(diatomics.degreesOfFreedom).toBe(3 * 128 - 128 - 3);
    expect(Math.abs(diatomics.temperatureK.mean / 300 - 1)).toBeLessThan(0.05);

    // The three argon runs form a series that started no runs of its own and, by the engine's own
    // criteria (phase-criteria.ts), names the 40 K run solid and the 90 K and 130 K runs liquid, so
    // melting is bracketed between 40 and 90 K (LJ argon melts near 84 K at its triple point; FROM MEMORY).
    expect(runs).toHaveLength(4);
    const [demoSeries] = await ctx.db.select().from(series).where(inArray(series.projectId, labIds));
    expect(demoSeries!.name).toBe(DEMO_SERIES[0]!.name);
    const lab = await getLinkedSeries(ctx, demoSeries!.id);
    expect(lab.status).toBe('ready');
    expect(lab.members.map((m) => m.trajectoryName)).toEqual(DEMO_SERIES[0]!.files);
    expect(lab.results!.members.map((m) => m.phase.phase), JSON.stringify(lab.results!.members.map((m) => m.phase))).toEqual(['solid', 'liquid', 'liquid']);
    const melting = lab.results!.melting.brackets[0]!;
    expect([melting.below?.temperatureK, melting.above?.temperatureK].map((t) => Math.round((t ?? 0) / 10) * 10)).toEqual([40, 90]);
    expect(lab.results!.caloric.energyKind).toBe('total');
    expect(lab.results!.caloric.latentHeat).not.toBeNull();

    // Every lab run reads the temperature it states (kinetic mean within 5 %, and no card warning that they differ).
    const temperatures = [...byFile].map(([file, r]) => {
      const thermo = (r.summary as { thermo?: { temperatureK: { mean: number }; statedTemperatureK?: number | null; warnings?: string[] } }).thermo;
      return { file, kinetic: thermo?.temperatureK.mean, stated: thermo?.statedTemperatureK, warnings: thermo?.warnings ?? [] };
    });
    expect(temperatures.filter((t) => t.kinetic !== undefined)).toHaveLength(4);
    for (const t of temperatures.filter((x) => x.kinetic !== undefined)) {
      expect(Math.abs(t.kinetic! / t.stated! - 1), JSON.stringify(t)).toBeLessThan(0.05);
      expect(t.warnings.filter((w) => /differ|stated/i.test(w)), JSON.stringify(t)).toEqual([]);
    }

    const again = await seedDemo(ctx, () => {});
    await again.ready;
    expect(await ctx.db.select().from(users).where(inArray(users.email, DEMO_ACCOUNTS.map((a) => a.email)))).toHaveLength(2);
    expect(await ctx.db.select().from(projects).where(inArray(projects.name, DEMO_PROJECTS.map((p) => p.name)))).toHaveLength(2);
  }, 300_000);
});
