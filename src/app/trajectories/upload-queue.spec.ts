// The queue and the API client are injectables, which need the JIT compiler when loaded outside an Angular build.
import '@angular/compiler';
import { Injector } from '@angular/core';
import { of, Subject } from 'rxjs';
import { describe, expect, it, vi } from 'vitest';
import type { TrajectoryDto } from '../../../shared/trajectory';
import type { UploadPolicy } from '../../../shared/upload-policy';
import { TrajectoriesApi, type UploadEvent } from './trajectories-api';
import { UploadQueue } from './upload-queue';

const GiB = 1024 ** 3;
const limits: UploadPolicy = { fileMaxBytes: 2 * GiB, decompressedMaxBytes: 20 * GiB, decompressionMaxRatio: 1000 };
/** Only name and size matter before sending; a real multi-GB File is not needed to say no to one. */
const file = (name: string, size: number) => ({ name, size }) as File;

function queueWith(readLimits: () => ReturnType<TrajectoriesApi['uploadPolicy']>) {
  const sent = new Subject<UploadEvent>();
  const api = { uploadPolicy: vi.fn(readLimits), upload: vi.fn(() => sent) };
  const injector = Injector.create({ providers: [{ provide: TrajectoriesApi, useValue: api }, { provide: UploadQueue }] });
  return { queue: injector.get(UploadQueue), api, sent };
}

describe('the upload queue and the site\'s upload limit', () => {
  it('when a file is larger than the limit, then it is refused before a byte is sent, naming its size, the limit and what to do', () => {
    const { queue, api } = queueWith(() => of(limits));
    queue.add(3, [file('melt-5ns.extxyz', 3.5 * GiB)], () => {});
    expect(api.upload).not.toHaveBeenCalled();
    expect(queue.items()).toEqual([expect.objectContaining({
      name: 'melt-5ns.extxyz', state: 'failed',
      error: 'melt-5ns.extxyz is 3.5 GiB, larger than the upload limit of 2.0 GiB. Compress it with gzip or zip (text trajectories shrink several-fold, and are read compressed), or ask the site administrator to raise UPLOAD_MAX_BYTES.',
    })]);
  });

  it('when a file is exactly at the limit, then it is sent, and its progress and result are followed', () => {
    const { queue, api, sent } = queueWith(() => of(limits));
    const stored: TrajectoryDto[] = [];
    queue.add(3, [file('at-limit.extxyz', 2 * GiB)], (t) => stored.push(t));
    expect(api.upload).toHaveBeenCalledTimes(1);
    sent.next({ kind: 'progress', loaded: GiB, total: 2 * GiB });
    expect(queue.items()[0]).toMatchObject({ state: 'sending', percent: 50 });
    sent.next({ kind: 'done', trajectory: { id: 41 } as TrajectoryDto });
    expect(queue.items()[0]).toMatchObject({ state: 'stored', trajectoryId: 41 });
    expect(stored.map((t) => t.id)).toEqual([41]);
  });

  it('when the limits cannot be read, then the file is sent anyway and the server decides', () => {
    const { queue, api } = queueWith(() => of(null));
    queue.add(3, [file('unknown-limit.extxyz', 5 * GiB)], () => {});
    expect(api.upload).toHaveBeenCalledTimes(1);
    expect(queue.items()[0]).toMatchObject({ state: 'sending' });
  });

  it('when several files are chosen at once, then only the one over the limit is refused', () => {
    const { queue, api } = queueWith(() => of(limits));
    queue.add(3, [file('small.xyz', 1024), file('huge.xyz', 3 * GiB)], () => {});
    expect(api.upload).toHaveBeenCalledTimes(1);
    expect(queue.items().map((i) => [i.name, i.state])).toEqual([['small.xyz', 'sending'], ['huge.xyz', 'failed']]);
  });
});
