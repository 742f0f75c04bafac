import { of } from 'rxjs';
import { describe, expect, it, vi } from 'vitest';
import type { AnalysisRunDto } from '../../../shared/analysis-run';
import { watchJob } from './job-watch';

const run = (status: AnalysisRunDto['status'], progress: number) => ({ status, progress }) as AnalysisRunDto;

describe('watching a job', () => {
  it('when the job goes queued → running → done, then every state is seen once and polling stops after done', async () => {
    const states = [run('queued', 0), run('running', 40), run('done', 100), run('done', 100)];
    const fetch = vi.fn(() => of(states.shift()!));
    const seen: string[] = [];
    await new Promise<void>((resolve) => watchJob(fetch, 1, 2).subscribe({ next: (r) => seen.push(`${r.status}:${r.progress}`), complete: resolve }));
    expect(seen).toEqual(['queued:0', 'running:40', 'done:100']);
    expect(fetch).toHaveBeenCalledTimes(3);
  });
});
