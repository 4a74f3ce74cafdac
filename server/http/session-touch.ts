import type { Store } from 'express-session';

/**
 * How often a signed-in session's stored expiry is moved forward. The session store writes the
 * new expiry on every request otherwise (a database write per API call, the larger part of a
 * signed-in request's fixed cost); once every few minutes keeps a week-long session alive just
 * the same, ending at most this much earlier than a touch per request would.
 */
export const TOUCH_EVERY_MS = 5 * 60 * 1000;

/**
 * Wraps `store.touch` so that each session's expiry is written at most once per `everyMs` by this
 * process. A session that is saved (changed) or destroyed is written as before; only the
 * unchanged session's bookkeeping touch is skipped. The memory is one timestamp per session
 * touched in the last `everyMs`, pruned as it goes.
 */
export function throttleTouch(store: Store, everyMs: number, now: () => number = Date.now) {
  const touch = store.touch?.bind(store);
  if (!touch) return;
  const last = new Map<string, number>();
  let pruneAt = now() + everyMs;
  // express-session passes a callback taking an error, though the types say it takes none
  store.touch = (sid, session, callback) => {
    const done = callback as ((err?: unknown) => void) | undefined;
    const t = now();
    if (t >= pruneAt) {
      for (const [k, at] of last) if (t - at >= everyMs) last.delete(k);
      pruneAt = t + everyMs;
    }
    const at = last.get(sid);
    if (at !== undefined && t - at < everyMs) {
      done?.();
      return;
    }
    last.set(sid, t);
    touch(sid, session, ((err?: unknown) => {
      if (err) last.delete(sid);
      done?.(err);
    }) as () => void);
  };
  const destroy = store.destroy.bind(store);
  store.destroy = (sid, done) => {
    last.delete(sid);
    destroy(sid, done);
  };
}
