import { createConnection } from 'node:net';

/** Resolves once something accepts TCP connections on 127.0.0.1:port. */
export async function waitForPort(port: number, timeoutMs = 30_000, what = 'service'): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const open = await new Promise<boolean>((resolve) => {
      const socket = createConnection({ host: '127.0.0.1', port });
      socket.once('connect', () => { socket.destroy(); resolve(true); });
      socket.once('error', () => resolve(false));
    });
    if (open) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${what} did not open 127.0.0.1:${port} within ${timeoutMs} ms`);
}

/** Refuses to start a service on a port something else already answers on. */
export async function assertPortFree(port: number, what: string, variable: string): Promise<void> {
  const taken = await new Promise<boolean>((resolve) => {
    const socket = createConnection({ host: '127.0.0.1', port });
    socket.once('connect', () => { socket.destroy(); resolve(true); });
    socket.once('error', () => resolve(false));
  });
  if (taken) throw new Error(`${what} cannot start: 127.0.0.1:${port} is already in use (another Ergodic still running?). Stop it, or choose another port with ${variable}.`);
}

/** Asks the kernel for a free loopback port. */
export async function freePort(): Promise<number> {
  const { createServer } = await import('node:net');
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}
