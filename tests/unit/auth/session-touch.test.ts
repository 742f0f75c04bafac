import session from 'express-session';
import { describe, expect, it } from 'vitest';
import { SESSION_TOUCH_EVERY_MS, throttleTouches } from '../../../server/auth/session.ts';

/** A session store that records each expiry write, failing the ones it is told to. */
class RecordingStore extends session.MemoryStore {
  writes: string[] = [];
  failNext = false;
  override touch(sid: string, data: session.SessionData, callback?: (err?: unknown) => void): void {
    this.writes.push(sid);
    const fail = this.failNext;
    this.failNext = false;
    callback?.(fail ? new Error('database away') : undefined);
  }
}

const data = { cookie: { originalMaxAge: 1000, expires: new Date() } } as session.SessionData;

function touch(store: session.Store, sid: string): Promise<unknown> {
  return new Promise((resolve) => store.touch!(sid, data, ((err?: unknown) => resolve(err)) as () => void));
}

describe('writing a rolling session\'s new expiry', () => {
  it('when one session makes many requests, then its expiry is written once per interval, and each other session still gets its own write', async () => {
    const store = new RecordingStore();
    let now = 0;
    throttleTouches(store, () => now);
    await touch(store, 'a');
    await touch(store, 'a');
    await touch(store, 'b');
    now += SESSION_TOUCH_EVERY_MS - 1;
    await touch(store, 'a');
    expect(store.writes).toEqual(['a', 'b']);
    now += 1;
    await touch(store, 'a');
    expect(store.writes).toEqual(['a', 'b', 'a']);
  });

  it('when a write fails, then the error reaches express-session and the next request writes again', async () => {
    const store = new RecordingStore();
    throttleTouches(store, () => 0);
    store.failNext = true;
    expect(await touch(store, 'a')).toBeInstanceOf(Error);
    expect(await touch(store, 'a')).toBeUndefined();
    expect(store.writes).toEqual(['a', 'a']);
  });
});
