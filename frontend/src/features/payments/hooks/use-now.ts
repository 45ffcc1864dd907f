import { useEffect, useState } from 'react';

/** The clock, ticking every `everyMs` while `running` (a countdown's "now"). */
export function useNow(everyMs = 1000, running = true): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!running) return;
    const tick = () => setNow(Date.now());
    const timer = window.setInterval(tick, everyMs);
    return () => window.clearInterval(timer);
  }, [everyMs, running]);
  return now;
}

/** "4:05" (minutes:seconds) or "1:02:09" left until `untilMs`; "0:00" once passed. */
export function countdownWords(untilMs: number, now: number): string {
  const total = Math.max(0, Math.ceil((untilMs - now) / 1000));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const ss = String(s).padStart(2, '0');
  return h ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}
