import Chip from '@mui/material/Chip';
import type { AppointmentState } from '@loamline/shared-types';
import { STATE_COLORS, STATE_LABELS } from '../utils/states';

/** An appointment's state as a small chip: live states filled, ended ones outlined. */
export function StateChip({ state }: { state: AppointmentState }) {
  const ended = !['held', 'requested', 'confirmed'].includes(state);
  return (
    <Chip
      size="small"
      label={STATE_LABELS[state]}
      color={STATE_COLORS[state]}
      variant={ended ? 'outlined' : 'filled'}
      sx={{ fontWeight: 500, height: 22 }}
    />
  );
}
