import Chip from '@mui/material/Chip';
import type { AppointmentState } from '@loamline/shared-types';
import { STATE_LABELS } from '../utils/words';

const COLOR: Record<AppointmentState, 'default' | 'primary' | 'success' | 'warning' | 'error' | 'info'> = {
  held: 'warning',
  requested: 'info',
  confirmed: 'success',
  declined: 'error',
  cancelled: 'default',
  expired: 'default',
  completed: 'primary',
  no_show: 'default',
};

/** The appointment's state in a word or two, coloured by how it stands. */
export function StateChip({ state }: { state: AppointmentState }) {
  return <Chip size="small" color={COLOR[state]} label={STATE_LABELS[state]} sx={{ fontWeight: 500 }} />;
}
