import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';

/**
 * "Start over?" — a module of its own, loaded the first time the rider asks (baseline-wizard.tsx), so
 * that the wizard's first screen does not fetch and run the dialog's code (issue 12).
 */
export function StartOverDialog({
  open,
  onKeep,
  onStartOver,
}: {
  open: boolean;
  onKeep: () => void;
  onStartOver: () => void;
}) {
  return (
    <Dialog open={open} onClose={onKeep} aria-labelledby="start-over-title">
      <DialogTitle id="start-over-title">Start over?</DialogTitle>
      <DialogContent>
        <DialogContentText>
          Everything entered in this wizard is cleared. Saved baseline sheets and your garage stay as they
          are.
        </DialogContentText>
      </DialogContent>
      <DialogActions>
        <Button onClick={onKeep}>Keep my input</Button>
        <Button variant="contained" onClick={onStartOver}>
          Start over
        </Button>
      </DialogActions>
    </Dialog>
  );
}
