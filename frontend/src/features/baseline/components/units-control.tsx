import StraightenIcon from '@mui/icons-material/Straighten';
import Button from '@mui/material/Button';
import Popover from '@mui/material/Popover';
import Stack from '@mui/material/Stack';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useId, useState } from 'react';
import type { UnitPrefs } from '@/lib/units';

const GROUPS: { key: keyof UnitPrefs; label: string; options: readonly [string, string] }[] = [
  { key: 'mass', label: 'Weight', options: ['kg', 'lb'] },
  { key: 'pressure', label: 'Pressure', options: ['psi', 'bar'] },
  { key: 'length', label: 'Travel and sag', options: ['mm', 'in'] },
];

/** The rider's units, in one small button that opens three switches; remembered per browser. */
export function UnitsControl({
  units,
  onChange,
}: {
  units: UnitPrefs;
  onChange: (change: Partial<UnitPrefs>) => void;
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
        aria-label={`Units: ${units.mass}, ${units.pressure}, ${units.length}`}
        onClick={(e) => setAnchor(e.currentTarget)}
        sx={{ minHeight: 40, whiteSpace: 'nowrap', bgcolor: 'background.paper' }}
      >
        {units.mass} · {units.pressure} · {units.length}
      </Button>
      <Popover
        id={id}
        open={!!anchor}
        anchorEl={anchor}
        onClose={() => setAnchor(null)}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'right' }}
        transformOrigin={{ vertical: 'top', horizontal: 'right' }}
        slotProps={{ paper: { role: 'dialog', 'aria-label': 'Units', sx: { p: 2, width: 260 } } }}
      >
        <Stack spacing={1.5}>
          {GROUPS.map((g) => (
            <Stack key={g.key} spacing={0.5}>
              <Typography variant="body2" sx={{ fontWeight: 500 }} id={`${id}-${g.key}`}>
                {g.label}
              </Typography>
              <ToggleButtonGroup
                exclusive
                fullWidth
                color="primary"
                aria-labelledby={`${id}-${g.key}`}
                value={units[g.key]}
                onChange={(_e, v: string | null) => {
                  if (v) onChange({ [g.key]: v });
                }}
              >
                {g.options.map((o) => (
                  <ToggleButton key={o} value={o}>
                    {o}
                  </ToggleButton>
                ))}
              </ToggleButtonGroup>
            </Stack>
          ))}
          <Typography variant="caption" color="text.secondary">
            Remembered on this device.
          </Typography>
        </Stack>
      </Popover>
    </>
  );
}
