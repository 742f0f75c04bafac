import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';

export interface S3FakeOptions {
  dataDir: string;
  port: number;
  bucket: string;
}

export interface RunningFake {
  name: string;
  stop(): Promise<void>;
}

/**
 * A local S3-compatible store for development and tests. Any real
 * S3-compatible service works in its place through configuration.
 */
export async function startS3Fake(options: S3FakeOptions): Promise<RunningFake> {
  mkdirSync(options.dataDir, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port: options.port,
    directory: options.dataDir,
    silent: true,
    configureBuckets: [{ name: options.bucket, configs: [] }],
  });
  await server.run();
  return { name: 'S3 fake', stop: () => server.close() };
}
