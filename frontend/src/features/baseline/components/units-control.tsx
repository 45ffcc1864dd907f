import StraightenIcon from '@mui/icons-material/Straighten';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Popover from '@mui/material/Popover';
import Stack from '@mui/material/Stack';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useId, useState } from 'react';
import { unitPrefs, type PressureUnit, type UnitPrefs, type UnitSystem } from '@/lib/units';
import type { StoredUnits } from '../hooks/use-unit-prefs';

const SYSTEMS: { value: UnitSystem; label: string }[] = [
  { value: 'metric', label: 'Metric' },
  { value: 'imperial', label: 'Imperial' },
];
const PRESSURES: readonly PressureUnit[] = ['psi', 'bar'];

/** "kg, mm, cm³, m, °C": what a system shows, from the same table the conversions use. */
const unitsOf = (system: UnitSystem): string => {
  const u = unitPrefs(system, 'psi');
  return [u.mass, u.length, u.volume, u.altitude, u.temperature].join(', ');
};

/**
 * The rider's units in one small button that opens two switches: metric or imperial (weight, lengths,
 * volumes, altitude, temperature) and psi or bar (what the pump's gauge reads). Remembered per browser.
 */
export function UnitsControl({
  units,
  onChange,
}: {
  units: UnitPrefs;
  onChange: (change: Partial<StoredUnits>) => void;
}) {
  const [anchor, setAnchor] = useState<HTMLElement | null>(null);
  const id = useId();
  return (
    <>
      <Button
        variant="outlined"
        size="small"
        startIcon={<StraightenIcon />}
        aria-haspopup="dialog"
        aria-controls={anchor ? id : undefined}
        aria-label={`Units: ${units.system}, ${units.pressure}`}
        onClick={(e) => setAnchor(e.currentTarget)}
        sx={{ minHeight: 40, whiteSpace: 'nowrap', bgcolor: 'background.paper' }}
      >
        {units.mass} · {units.length} · {units.pressure}
      </Button>
      <Popover
        id={id}
        open={!!anchor}
        anchorEl={anchor}
        onClose={() => setAnchor(null)}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'right' }}
        transformOrigin={{ vertical: 'top', horizontal: 'right' }}
        slotProps={{ paper: { role: 'dialog', 'aria-label': 'Units', sx: { p: 2, width: 290 } } }}
      >
        <Stack spacing={2}>
          <Stack spacing={0.5}>
            <Typography variant="body2" sx={{ fontWeight: 500 }} id={`${id}-system`}>
              Weight, lengths, volumes, altitude, temperature
            </Typography>
            <ToggleButtonGroup
              exclusive
              fullWidth
              color="primary"
              aria-labelledby={`${id}-system`}
              value={units.system}
              onChange={(_e, v: UnitSystem | null) => {
                if (v) onChange({ system: v });
              }}
            >
              {SYSTEMS.map((s) => (
                <ToggleButton key={s.value} value={s.value} aria-label={`${s.label}: ${unitsOf(s.value)}`}>
                  <Box>
                    <Box component="span" sx={{ display: 'block', fontWeight: 500 }}>
                      {s.label}
                    </Box>
                    <Box component="span" sx={{ display: 'block', fontSize: '0.75rem' }}>
                      {unitsOf(s.value)}
                    </Box>
                  </Box>
                </ToggleButton>
              ))}
            </ToggleButtonGroup>
          </Stack>
          <Stack spacing={0.5}>
            <Typography variant="body2" sx={{ fontWeight: 500 }} id={`${id}-pressure`}>
              Pressure (what your pump reads)
            </Typography>
            <ToggleButtonGroup
              exclusive
              fullWidth
              color="primary"
              aria-labelledby={`${id}-pressure`}
              value={units.pressure}
              onChange={(_e, v: PressureUnit | null) => {
                if (v) onChange({ pressure: v });
              }}
            >
              {PRESSURES.map((p) => (
                <ToggleButton key={p} value={p}>
                  {p}
                </ToggleButton>
              ))}
            </ToggleButtonGroup>
          </Stack>
          <Typography variant="caption" color="text.secondary">
            Remembered on this device.
          </Typography>
        </Stack>
      </Popover>
    </>
  );
}
