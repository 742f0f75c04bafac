import type { AppContext } from '../context.ts';
import { sql } from 'drizzle-orm';
import { APP_VERSION } from '../version.ts';
import type { HealthReport, ServiceStatus } from '../../shared/health.ts';


async function probe(check: () => Promise<unknown>, timeoutMs = 3000): Promise<ServiceStatus> {
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      check(),
      new Promise((_, reject) => { timer = setTimeout(() => reject(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs); }),
    ]);
    return { status: 'ok' };
  } catch (err) {
    return { status: 'down', reason: err instanceof Error ? err.message || err.name : String(err) };
  } finally {
    clearTimeout(timer);
  }
}

export async function checkHealth(ctx: AppContext): Promise<HealthReport> {
  const [database, queue, storage, mail] = await Promise.all([
    probe(() => ctx.db.execute(sql`SELECT 1`)),
    probe(() => ctx.queue.ping()),
    probe(() => ctx.store.ping()),
    probe(() => ctx.mailer.ping()),
  ]);
  const services = { database, queue, storage, mail };
  const allOk = Object.values(services).every((s) => s.status === 'ok');
  return { status: allOk ? 'ok' : 'degraded', version: APP_VERSION, services };
}
