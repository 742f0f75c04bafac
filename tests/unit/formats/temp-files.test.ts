import { mkdir, readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openTrajectory } from '../../../server/formats/open-trajectory.ts';
import { removeOrphanedJobTempDirs, withJobTempDir } from '../../../server/jobs/job-temp-dir.ts';
import { load as plainPackagesLoad } from '../../../server/prebuilt/plain-packages-hooks.mjs';
import { chunked, failure, gzip, makeSystem, readAll, tempDir, writeH5md, zip, type TempDir } from './synthetic.ts';

/**
 * H5MD that arrives as a stream or inside gzip/zip is copied to a temp file
 * (HDF5 needs random access). The copy is capped, and nothing of it stays
 * behind after a read that succeeds, fails or is stopped early.
 */
let dir: TempDir;
let spoolRoot: string;
let h5gz: Buffer;
let h5Bytes: number;

beforeAll(async () => {
  dir = await tempDir();
  spoolRoot = dir.file('spool');
  await mkdir(spoolRoot);
  await writeH5md(dir.file('run.h5'), makeSystem(40, 30));
  const raw = await readFile(dir.file('run.h5'));
  h5Bytes = raw.length;
  h5gz = gzip(raw);
});
afterAll(() => dir.remove());

const leftInSpool = () => readdir(spoolRoot);

describe('temporary copies of streamed H5MD', () => {
  it('when an H5MD inside gzip is read to the end, then every frame arrives and the temp folder is empty again', async () => {
    const frames = await readAll(h5gz, 'run.h5.gz', { tempDir: spoolRoot });
    expect(frames).toHaveLength(30);
    expect(frames[0]!.positions).toHaveLength(120);
    expect(await leftInSpool()).toEqual([]);
  });

  it('when the copy would pass the temp-file limit, then the read is refused naming the file and the limit, and nothing stays', async () => {
    const limit = Math.floor(h5Bytes / 2);
    const message = await failure(() => readAll(h5gz, 'run.h5.gz', { tempDir: spoolRoot, maxTempFileBytes: limit }));
    expect(message).toMatch(new RegExp(`^run\\.h5\\.gz: HDF5 data needs a temporary copy of more than ${limit} bytes \\(\\d+ KiB, the temporary-file limit \\(JOB_TEMP_MAX_BYTES\\)\\); refused on reaching \\d+ bytes`));
    expect(await leftInSpool()).toEqual([]);
    // Exactly the file's size fits.
    expect(await readAll(h5gz, 'run.h5.gz', { tempDir: spoolRoot, maxTempFileBytes: h5Bytes })).toHaveLength(30);
  });

  it('when the decompressed-size limit is the smaller one, then it is the one named, for gzip and for a plain stream alike', async () => {
    const limit = Math.floor(h5Bytes / 3);
    expect(await failure(() => readAll(h5gz, 'run.h5.gz', { tempDir: spoolRoot, maxDecompressedBytes: limit })))
      .toMatch(new RegExp(`^run\\.h5\\.gz: gzip data expands beyond the limit of ${limit} bytes`));
    const plain = await readFile(dir.file('run.h5'));
    expect(await failure(() => readAll(chunked(plain, [4096]), 'run.h5', { tempDir: spoolRoot, maxDecompressedBytes: limit, maxTempFileBytes: 10 * limit })))
      .toMatch(new RegExp(`^run\\.h5: HDF5 data needs a temporary copy of more than ${limit} bytes .*the decompressed-size limit \\(DECOMPRESSED_MAX_BYTES\\)`));
    expect(await leftInSpool()).toEqual([]);
  });

  it('when the copy inside a zip passes the limit, then it is refused the same way', async () => {
    const zipped = zip({ 'run.h5': await readFile(dir.file('run.h5')) });
    expect(await failure(() => readAll(zipped, 'run.zip', { tempDir: spoolRoot, maxTempFileBytes: 4096 })))
      .toMatch(/^run\.zip\/run\.h5: HDF5 data needs a temporary copy of more than 4096 bytes/);
    expect(await leftInSpool()).toEqual([]);
  });

  it('when the gzip holds bytes that are not HDF5 after its signature, then the read fails and nothing stays', async () => {
    const broken = Buffer.concat([Buffer.from([0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(50_000, 7)]);
    expect(await failure(() => readAll(gzip(broken), 'broken.h5.gz', { tempDir: spoolRoot }))).toMatch(/^broken\.h5\.gz: not a readable HDF5 file/);
    expect(await leftInSpool()).toEqual([]);
  });

  it('when the stream breaks off while it is being copied, then the partial copy is removed', async () => {
    async function* cut(): AsyncGenerator<Uint8Array> {
      yield h5gz.subarray(0, 1024);
      throw new Error('connection to the object store lost');
    }
    expect(await failure(() => readAll(cut(), 'run.h5.gz', { tempDir: spoolRoot }))).toMatch(/connection to the object store lost|corrupt or truncated/);
    expect(await leftInSpool()).toEqual([]);
  });

  it('when the reader is stopped after its first frame (a cancel), then the copy is removed', async () => {
    const opened = await openTrajectory(chunked(h5gz, [65536]), 'run.h5.gz', { tempDir: spoolRoot });
    const first = await opened.frames.next();
    expect(first.done).toBe(false);
    expect((await leftInSpool()).length).toBe(1);
    await opened.frames.return(undefined);
    expect(await leftInSpool()).toEqual([]);
  });
});

describe('a job\'s own temp folder', () => {
  it('when a job succeeds, fails or is stopped, then its folder is gone afterwards', async () => {
    const root = dir.file('jobs');
    let seen = '';
    expect(await withJobTempDir(root, async (d) => {
      seen = d;
      expect(await readdir(root)).toEqual([d.slice(root.length + 1)]);
      return 'done';
    })).toBe('done');
    expect(seen).toMatch(new RegExp(`ergodic-job-${process.pid}-`));
    await expect(withJobTempDir(root, async () => { throw new Error('the file was malformed'); })).rejects.toThrow('the file was malformed');
    // A cancel ends the handler with an error after it has written into its folder.
    await expect(withJobTempDir(root, async (d) => {
      await mkdir(join(d, 'copy'));
      throw new Error('cancelled');
    })).rejects.toThrow('cancelled');
    expect(await readdir(root)).toEqual([]);
  });

  it('when a worker starts, then it removes folders of job processes that have ended and keeps those of running ones', async () => {
    const root = dir.file('orphans');
    // Process ids above the kernel's maximum (4194304) never run.
    await mkdir(join(root, 'ergodic-job-9999999-abc', 'nested'), { recursive: true });
    await mkdir(join(root, `ergodic-job-${process.pid}-def`), { recursive: true });
    await mkdir(join(root, 'someone-elses-folder'), { recursive: true });
    expect(await removeOrphanedJobTempDirs(root)).toBe(1);
    expect((await readdir(root)).sort()).toEqual([`ergodic-job-${process.pid}-def`, 'someone-elses-folder']);
    expect(await removeOrphanedJobTempDirs(dir.file('no-such-folder'))).toBe(0);
  });
});

describe('the HDF5 module and the TypeScript loader', () => {
  it('when h5wasm is imported under the loader, then Node\'s own loader reads it unchanged and the next loader is never asked', async () => {
    const asked: string[] = [];
    const next = async (url: string) => {
      asked.push(url);
      return { format: 'module', source: 'transformed', shortCircuit: true };
    };
    const url = new URL('../../../node_modules/h5wasm/dist/node/hdf5_util.js', import.meta.url).href;
    const loaded = await plainPackagesLoad(url, { format: 'module' }, next);
    expect(asked).toEqual([]);
    expect(loaded.shortCircuit).toBe(true);
    expect(Buffer.from(loaded.source as Uint8Array).equals(await readFile(new URL(url)))).toBe(true);
    // Everything else still goes to the TypeScript loader.
    const ours = new URL('../../../server/formats/spool.ts', import.meta.url).href;
    expect((await plainPackagesLoad(ours, {}, next)).source).toBe('transformed');
    expect(asked).toEqual([ours]);
  });
});
