import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';

/** A list or page that did not load: the server's message and a way to try again. */
export function LoadError({ what, error, onRetry }: { what: string; error: Error; onRetry: () => void }) {
  return (
    <Alert
      severity="error"
      action={
        <Button color="inherit" onClick={onRetry}>
          Try again
        </Button>
      }
    >
      {what} did not load: {error.message}
    </Alert>
  );
}
