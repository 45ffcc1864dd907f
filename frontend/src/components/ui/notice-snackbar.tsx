import Alert, { type AlertColor } from '@mui/material/Alert';
import Snackbar from '@mui/material/Snackbar';
import type { ReactNode } from 'react';

export interface NoticeSnackbarProps {
  open: boolean;
  onClose: () => void;
  severity: AlertColor;
  autoHideDuration: number;
  children: ReactNode;
}

/**
 * A filled alert in a snackbar at the bottom: the app's notices (signed out, can't reach the server).
 * Loaded through `lazy()` the first time a notice is shown (`LazyNoticeSnackbar`), so Snackbar and Alert
 * are not part of every page's first download.
 */
export function NoticeSnackbar({ open, onClose, severity, autoHideDuration, children }: NoticeSnackbarProps) {
  return (
    <Snackbar
      open={open}
      autoHideDuration={autoHideDuration}
      onClose={(_e, reason) => reason !== 'clickaway' && onClose()}
      anchorOrigin={{ vertical: 'bottom', horizontal: 'center' }}
    >
      <Alert severity={severity} variant="filled" onClose={onClose} sx={{ width: '100%' }}>
        {children}
      </Alert>
    </Snackbar>
  );
}
