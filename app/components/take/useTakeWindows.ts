import { useCallback, useMemo, useRef, useState } from "react";
import {
  stitchWindows,
  windowCount,
  windowStart,
  WINDOW_SIZE,
  type TakeWindow,
  type Timeline,
} from "~/takes/takeWindows";

export type KnownTake = ReturnType<typeof stitchWindows>;

/**
 * The take's analysis as far as the browser has it: the page's first window, and the others
 * fetched from /api/takes/:id/window as they are needed (the URL names the analysis version,
 * so the browser's cache answers a window asked for again).
 */
export function useTakeWindows(takeId: string, version: string, timeline: Timeline, first: TakeWindow) {
  const [windows, setWindows] = useState<ReadonlyMap<number, TakeWindow>>(() => new Map([[first.from, first]]));
  const pending = useRef(new Map<number, Promise<TakeWindow | null>>());
  const have = useRef(windows);
  have.current = windows;
  const known = useMemo(() => stitchWindows(timeline, windows), [timeline, windows]);
  const last = (windowCount(timeline.changeCount) - 1) * WINDOW_SIZE;
  const startOf = useCallback((index: number) => Math.min(last, windowStart(index)), [last]);

  const fetchWindow = useCallback(
    (from: number): Promise<TakeWindow | null> => {
      const had = have.current.get(from);
      if (had) return Promise.resolve(had);
      const running = pending.current.get(from);
      if (running) return running;
      const p = fetch(`/api/takes/${encodeURIComponent(takeId)}/window?from=${from}&v=${encodeURIComponent(version)}`, {
        credentials: "same-origin",
        headers: { Accept: "application/json" },
      })
        .then((r) => (r.ok ? (r.json() as Promise<TakeWindow>) : null))
        .catch(() => null)
        .finally(() => pending.current.delete(from));
      pending.current.set(from, p);
      return p;
    },
    [takeId, version],
  );

  const add = useCallback((got: Array<TakeWindow | null>) => {
    const fresh = got.filter((w): w is TakeWindow => w !== null && !have.current.has(w.from));
    if (fresh.length === 0) return have.current;
    const next = new Map(have.current);
    for (const w of fresh) next.set(w.from, w);
    have.current = next;
    setWindows(next);
    return next;
  }, []);

  /** Ask for the windows holding these changes (or chords), if not already here. */
  const need = useCallback(
    (...indices: number[]) => {
      const wanted = [...new Set(indices.filter((i) => i >= 0).map(startOf))].filter((f) => !have.current.has(f));
      if (wanted.length) void Promise.all(wanted.map(fetchWindow)).then(add);
    },
    [startOf, fetchWindow, add],
  );

  /** Every window, for playing the whole take: resolves with the whole take stitched together. */
  const loadAll = useCallback(async (): Promise<KnownTake> => {
    const missing: number[] = [];
    for (let f = 0; f <= last; f += WINDOW_SIZE) if (!have.current.has(f)) missing.push(f);
    // A few at a time, so a very long take does not open hundreds of requests at once.
    for (let i = 0; i < missing.length; i += 6) add(await Promise.all(missing.slice(i, i + 6).map(fetchWindow)));
    return stitchWindows(timeline, have.current);
  }, [last, add, fetchWindow, timeline]);

  const isLoaded = useCallback((index: number) => windows.has(startOf(index)), [windows, startOf]);

  return { known, need, isLoaded, loadAll, complete: windows.size === windowCount(timeline.changeCount) };
}
