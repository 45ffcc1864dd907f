import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import Chip from '@mui/material/Chip';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { formatNumber, formatQuantity, type UnitPrefs } from '@/lib/units';
import { fitSpring, rejectFit, storeFit } from '../api/workshop-report';
import { partName, type FitResult, type Part } from '../types';
import { serverMessage } from '../utils/errors';
import { formatForceN, formatLength } from '../utils/settings-units';
import { compactCells } from './table-styles';

type ParamKey = keyof FitResult['identified'];

function paramRows(fit: FitResult, prefs: UnitPrefs): { key: ParamKey; label: string; value: string }[] {
  const g = fit.geometry;
  return [
    {
      key: 'positiveLengthMm',
      label: 'Positive air column (effective length)',
      value: formatLength(g.positiveLengthMm, prefs),
    },
    {
      key: 'negativeVolumeCm3',
      label: 'Negative chamber volume',
      value: formatQuantity('volume', g.negativeVolumeCm3, prefs),
    },
    {
      key: 'endStrokeVolumeCm3',
      label: 'End-stroke chamber volume',
      value: g.endStrokeVolumeCm3 === null ? 'none' : formatQuantity('volume', g.endStrokeVolumeCm3, prefs),
    },
    { key: 'frictionN', label: 'Friction offset', value: formatForceN(fit.frictionN, prefs) },
  ];
}

/** What a fit found and how well: geometry, residual, what the data pinned down, quality and reasons. */
export function FitSummary({ fit, prefs }: { fit: FitResult; prefs: UnitPrefs }) {
  const good = fit.quality === 'good';
  return (
    <Stack spacing={1.5} data-testid={`fit-${fit.part}`}>
      <Stack direction="row" spacing={1} sx={{ alignItems: 'center', flexWrap: 'wrap' }}>
        <Chip
          label={good ? 'Good fit' : 'Poor fit'}
          color={good ? 'success' : 'warning'}
          size="small"
          sx={{ fontWeight: 700 }}
        />
        <Typography variant="body2">
          Residual {formatForceN(fit.rmsN, prefs)} rms ({formatNumber(fit.relativeRms * 100, 1)} % of the
          measured force) over {fit.runIds.length} run{fit.runIds.length === 1 ? '' : 's'}
        </Typography>
        {fit.stored && <Chip label="Stored on the bike" color="primary" size="small" />}
        {fit.rejected && <Chip label="Rejected" size="small" />}
      </Stack>
      {fit.reasons.length > 0 && (
        <Alert severity={good ? 'info' : 'warning'} role={good ? undefined : 'note'}>
          <Box component="ul" sx={{ m: 0, pl: 2 }}>
            {fit.reasons.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </Box>
        </Alert>
      )}
      <Table size="small" aria-label={`${partName(fit.part)}: fitted geometry`} sx={compactCells}>
        <TableHead>
          <TableRow>
            <TableCell>Parameter</TableCell>
            <TableCell align="right">Fitted</TableCell>
            <TableCell>From the data</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {paramRows(fit, prefs).map((r) => (
            <TableRow key={r.key}>
              <TableCell component="th" scope="row">
                {r.label}
              </TableCell>
              <TableCell align="right" sx={{ whiteSpace: 'nowrap' }}>
                {r.value}
              </TableCell>
              <TableCell>
                {fit.identified[r.key]
                  ? 'pinned down'
                  : 'not pinned down: the runs don’t constrain it (kept at the default)'}
              </TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </Stack>
  );
}

/**
 * "Fit the bike's spring" for one part: fit from its runs, read the result, then store it on the
 * bike (a poor fit only after an explicit confirmation) or reject it.
 */
export function FitPanel({
  appointmentId,
  part,
  runs,
  fit: fromReport,
  hasBike,
  prefs,
  readOnly,
}: {
  appointmentId: string;
  part: Part;
  /** the part's curve attachments */
  runs: number;
  fit: FitResult | null;
  hasBike: boolean;
  prefs: UnitPrefs;
  readOnly?: boolean;
}) {
  const [latest, setLatest] = useState<FitResult | null>(null);
  // the answer of this page's last action, else the report's last fit of the part
  const fit = latest ?? fromReport;
  const [busy, setBusy] = useState<'fit' | 'store' | 'reject' | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [understood, setUnderstood] = useState(false);

  const act = async (what: 'fit' | 'store' | 'reject', fn: () => Promise<FitResult>) => {
    setBusy(what);
    setError(null);
    try {
      setLatest(await fn());
      return true;
    } catch (e) {
      setError(serverMessage(e));
      return false;
    } finally {
      setBusy(null);
    }
  };
  const fitId = fit?.id;
  const open = !!fit && !fit.stored && !fit.rejected;
  const store = () => {
    if (!fitId || !fit) return;
    if (fit.quality === 'poor') {
      setUnderstood(false);
      setConfirming(true);
      return;
    }
    void act('store', () => storeFit(appointmentId, fitId, false));
  };
  const name = partName(part);
  return (
    <Box component="section" aria-label={`${name}: the bike’s measured spring`} className="report-fit">
      <Stack direction="row" spacing={2} sx={{ alignItems: 'center', flexWrap: 'wrap', mb: 1 }}>
        <Typography variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
          {name}: the bike’s measured spring
        </Typography>
        {!readOnly && (
          <Button
            variant="outlined"
            disabled={runs === 0 || busy !== null}
            onClick={() => void act('fit', () => fitSpring(appointmentId, part))}
          >
            {busy === 'fit' ? 'Fitting…' : fit ? 'Fit again' : 'Fit the bike’s spring'}
          </Button>
        )}
      </Stack>
      {runs === 0 && !fit && (
        <Typography variant="body2" color="text.secondary">
          Upload at least one {part === 'fork' ? 'fork' : 'shock'} curve to fit its geometry.
        </Typography>
      )}
      {fit && <FitSummary fit={fit} prefs={prefs} />}
      {fit && open && !readOnly && (
        <Stack direction="row" spacing={1.5} sx={{ mt: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
          <Button variant="contained" disabled={!fitId || !hasBike || busy !== null} onClick={store}>
            {busy === 'store' ? 'Storing…' : 'Store on the bike'}
          </Button>
          <Button
            variant="outlined"
            color="error"
            disabled={!fitId || busy !== null}
            onClick={() => fitId && void act('reject', () => rejectFit(appointmentId, fitId))}
          >
            Reject
          </Button>
          {!hasBike && (
            <Typography variant="body2" color="text.secondary">
              No bike on this appointment: there is nothing to store it on.
            </Typography>
          )}
          {!fitId && (
            <Typography variant="body2" color="text.secondary">
              Fit again to store or reject it.
            </Typography>
          )}
        </Stack>
      )}
      {fit?.stored && (
        <Typography variant="body2" sx={{ mt: 1 }}>
          Later baselines for this bike start from this geometry.
        </Typography>
      )}
      {error && (
        <Alert severity="error" role="alert" sx={{ mt: 1.5 }}>
          {error}
        </Alert>
      )}
      <Dialog
        open={confirming}
        onClose={() => setConfirming(false)}
        aria-labelledby={`fit-confirm-${part}`}
        maxWidth="sm"
      >
        <DialogTitle id={`fit-confirm-${part}`}>Store a poor fit on the bike?</DialogTitle>
        <DialogContent>
          <Typography variant="body2" sx={{ mb: 1 }}>
            The model does not explain these runs well. Every later baseline for this bike would start from
            this geometry instead of the default:
          </Typography>
          <Box component="ul" sx={{ mt: 0, pl: 2.5 }}>
            {fit?.reasons.map((r) => (
              <li key={r}>
                <Typography variant="body2">{r}</Typography>
              </li>
            ))}
          </Box>
          <FormControlLabel
            control={<Checkbox checked={understood} onChange={(e) => setUnderstood(e.target.checked)} />}
            label="I have checked the runs and want to store it anyway"
          />
        </DialogContent>
        <DialogActions sx={{ px: 3, pb: 2 }}>
          <Button onClick={() => setConfirming(false)}>Don’t store</Button>
          <Button
            variant="contained"
            color="warning"
            disabled={!understood || busy !== null}
            onClick={() =>
              fitId &&
              void act('store', () => storeFit(appointmentId, fitId, true)).then(
                (ok) => ok && setConfirming(false),
              )
            }
          >
            Store the poor fit
          </Button>
        </DialogActions>
      </Dialog>
    </Box>
  );
}
