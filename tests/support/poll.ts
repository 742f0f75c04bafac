/**
 * Reads until the value satisfies `done` or the time runs out, and returns
 * the last value read either way, so the assertion that follows says what
 * was seen rather than "timed out".
 */
export async function pollUntil<T>(read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 60_000, everyMs = 150): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (done(value) || Date.now() > deadline) return value;
    await new Promise((r) => setTimeout(r, everyMs));
  }
}
