import type { Store } from 'express-session';

/** How often a session's expiry is pushed back in the database while it is in use. */
export const TOUCH_AFTER_MS = 5 * 60 * 1000;

/**
 * With `rolling: true` express-session calls `store.touch` on every request that did not change the session,
 * which for a database store is one UPDATE (and, with synchronous=FULL, one disk sync) per request: a page that
 * loads ten queries writes ten times, and those writes compete with the count log for SQLite's one write lock.
 * This lets a session's touch through at most once per `touchAfterMs`; the cookie still rolls on every response.
 * A session of 12 hours that is touched at most 5 minutes late expires at most 5 minutes early.
 */
export function throttleTouch<S extends Store>(store: S, touchAfterMs = TOUCH_AFTER_MS, now: () => number = Date.now): S {
  const touch = store.touch?.bind(store);
  if (!touch) return store;
  const last = new Map<string, number>();
  const forget = (sid: string) => last.delete(sid);

  store.touch = (sid, session, callback) => {
    const t = now();
    const before = last.get(sid);
    if (before !== undefined && t - before < touchAfterMs) {
      callback?.();
      return;
    }
    last.set(sid, t);
    // Keep the map to the sessions seen within the window.
    if (last.size > 10_000) for (const [id, at] of last) if (t - at >= touchAfterMs) last.delete(id);
    touch(sid, session, callback);
  };

  const destroy = store.destroy.bind(store);
  store.destroy = (sid, callback) => {
    forget(sid);
    destroy(sid, callback);
  };
  // A save writes the expiry too: the next touch may wait a full window from here.
  const set = store.set.bind(store);
  store.set = (sid, session, callback) => {
    last.set(sid, now());
    set(sid, session, callback);
  };
  return store;
}
