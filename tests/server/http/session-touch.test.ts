import { describe, expect, it } from 'vitest';
import session from 'express-session';
import { throttleTouch } from '../../../server/http/session-touch';

/** express-session's own memory store, counting the expiry writes that reach it. */
function countingStore() {
  const store = new session.MemoryStore();
  const writes: string[] = [];
  const touch = store.touch.bind(store);
  store.touch = (sid, s, cb) => {
    writes.push(sid);
    touch(sid, s, cb);
  };
  return { store, writes };
}

const data = () => ({ cookie: { originalMaxAge: 1000, expires: new Date(Date.now() + 1000) } }) as unknown as session.SessionData;
const touchNow = (store: session.Store, sid: string) => new Promise<void>((resolve) => store.touch!(sid, data(), () => resolve()));

describe('session expiry writes', () => {
  it('when a signed-in session makes many requests within the interval, then its expiry is written once, and again after the interval', async () => {
    let t = 0;
    const { store, writes } = countingStore();
    throttleTouch(store, 300_000, () => t);
    for (let k = 0; k < 10; k++) {
      t = k * 1000;
      await touchNow(store, 'a');
    }
    expect(writes).toEqual(['a']);
    await touchNow(store, 'b');
    expect(writes).toEqual(['a', 'b']);
    t = 300_000;
    await touchNow(store, 'a');
    expect(writes).toEqual(['a', 'b', 'a']);
  });

  it('when a session is destroyed, then a new one under the same id is written on its first request', async () => {
    let t = 0;
    const { store, writes } = countingStore();
    throttleTouch(store, 300_000, () => t);
    await touchNow(store, 'a');
    await new Promise<void>((resolve) => store.destroy('a', () => resolve()));
    t = 10;
    await touchNow(store, 'a');
    expect(writes).toEqual(['a', 'a']);
  });
});
