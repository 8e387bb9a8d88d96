import { useEffect, useLayoutEffect, useRef, useState } from 'react';

// The play clock: counts while `running`, stops while the page is hidden (another tab, a
// locked phone) so the time played is time spent on the puzzle. Reports the total to
// `onTick` about once a second (the caller saves it).

export function useClock(initialMs: number, running: boolean, onTick: (ms: number) => void): { ms: number; read: () => number } {
  const [ms, setMs] = useState(initialMs);
  const base = useRef(initialMs);
  const since = useRef<number | null>(null);
  const tick = useRef(onTick);
  useLayoutEffect(() => {
    tick.current = onTick;
  });

  useEffect(() => {
    const stop = () => {
      if (since.current !== null) {
        base.current += performance.now() - since.current;
        since.current = null;
      }
    };
    const start = () => {
      if (since.current === null && document.visibilityState === 'visible') since.current = performance.now();
    };
    if (!running) {
      stop();
      setMs(Math.round(base.current));
      tick.current(Math.round(base.current));
      return;
    }
    start();
    const onVisibility = () => {
      if (document.visibilityState === 'visible') start();
      else {
        stop();
        tick.current(Math.round(base.current));
      }
    };
    document.addEventListener('visibilitychange', onVisibility);
    const id = window.setInterval(() => {
      const now = Math.round(base.current + (since.current === null ? 0 : performance.now() - since.current));
      setMs(now);
      tick.current(now);
    }, 1000);
    return () => {
      document.removeEventListener('visibilitychange', onVisibility);
      window.clearInterval(id);
      stop();
    };
  }, [running]);

  // read: the exact time now, between ticks too
  const read = () => Math.round(base.current + (since.current === null ? 0 : performance.now() - since.current));
  return { ms, read };
}

/** 372000 -> '6:12'; an hour or more -> '1:02:05' */
export function clockText(ms: number): string {
  const s = Math.floor(ms / 1000);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const sec = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${sec}` : `${m}:${sec}`;
}
