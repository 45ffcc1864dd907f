import { useEffect, useState } from 'react';
import { flushSync } from 'react-dom';

/**
 * True while the page is laid out for paper (printing, or print media emulated), so a component can
 * render differently there (the chart is drawn shorter). The change is rendered at once (flushSync):
 * the browser lays out the printed page right after `beforeprint`.
 */
export function usePrintMedia(): boolean {
  const [printing, setPrinting] = useState(
    () => typeof window.matchMedia === 'function' && window.matchMedia('print').matches,
  );
  useEffect(() => {
    if (typeof window.matchMedia !== 'function') return;
    const query = window.matchMedia('print');
    const set = (on: boolean) => flushSync(() => setPrinting(on));
    const onChange = (e: MediaQueryListEvent) => set(e.matches);
    const before = () => set(true);
    const after = () => set(query.matches);
    query.addEventListener('change', onChange);
    window.addEventListener('beforeprint', before);
    window.addEventListener('afterprint', after);
    return () => {
      query.removeEventListener('change', onChange);
      window.removeEventListener('beforeprint', before);
      window.removeEventListener('afterprint', after);
    };
  }, []);
  return printing;
}
