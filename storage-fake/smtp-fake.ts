import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';
import type { RunningFake } from './s3-fake.ts';

export interface SmtpFakeOptions {
  /** Each accepted message is kept here as an .eml file for the dev mail page. */
  mailDir: string;
  port: number;
}

/** Accepts every message on loopback and keeps it instead of delivering it. */
export async function startSmtpFake(options: SmtpFakeOptions): Promise<RunningFake> {
  mkdirSync(options.mailDir, { recursive: true });
  let counter = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const name = `${Date.now().toString().padStart(15, '0')}-${(counter++).toString().padStart(6, '0')}.eml`;
        writeFileSync(join(options.mailDir, name), Buffer.concat(chunks));
        callback();
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, '127.0.0.1', () => resolve());
  });
  return {
    name: 'SMTP fake',
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
