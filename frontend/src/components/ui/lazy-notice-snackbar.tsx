import { Suspense, lazy, useState } from 'react';
import type { NoticeSnackbarProps } from './notice-snackbar';

const NoticeSnackbar = lazy(() => import('./notice-snackbar').then((m) => ({ default: m.NoticeSnackbar })));

/**
 * `NoticeSnackbar`, fetched the first time it opens and kept mounted after that (so it can play its exit
 * transition and open again at once). Until then nothing is drawn and nothing of Snackbar/Alert is loaded.
 */
export function LazyNoticeSnackbar(props: NoticeSnackbarProps) {
  const [wanted, setWanted] = useState(props.open);
  if (props.open && !wanted) setWanted(true);
  if (!wanted) return null;
  return (
    <Suspense fallback={null}>
      <NoticeSnackbar {...props} />
    </Suspense>
  );
}
