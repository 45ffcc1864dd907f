import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { BaselineInput } from '@loamline/shared-types';
import { formatNumber, formatQuantity, type UnitPrefs } from '@/lib/units';
import { formatShown } from '../utils/number-display';
import { FEEL_CHOICES, STYLE_CHOICES } from '../utils/riding-choices';
import { formatPsi } from './pressure-text';

/** The inputs of a baseline in a few plain lines, for the screen and the printed sheet. */
export function describeInput(input: BaselineInput, units: UnitPrefs): { label: string; text: string }[] {
  const style = STYLE_CHOICES.find((c) => c.value === input.riding.style)?.label ?? input.riding.style;
  const feel = FEEL_CHOICES.find((c) => c.value === input.riding.feel)?.label ?? input.riding.feel;
  const lines = [
    {
      label: 'Rider',
      text: `${formatShown(input.rider.massKg, { quantity: 'mass', prefs: units })} with riding gear`,
    },
    { label: 'Riding', text: `${style}, ${feel.toLowerCase()}` },
  ];
  const f = input.fork;
  lines.push({
    label: 'Fork',
    text: f
      ? [
          `${formatQuantity('length', f.travelMm, units)} travel`,
          `${formatNumber(f.stanchionMm, 0)} mm stanchions`,
          f.spring,
          ...(f.spring === 'air'
            ? [
                `${f.spacers} spacer${f.spacers === 1 ? '' : 's'}`,
                f.endStroke
                  ? typeof f.endStroke.pressurePsi === 'number'
                    ? `end-stroke chamber at ${formatPsi(f.endStroke.pressurePsi, units.pressure)}`
                    : 'end-stroke chamber (pressure recommended)'
                  : 'no end-stroke chamber',
                ...(typeof f.maxPressurePsi === 'number'
                  ? [`maximum ${formatPsi(f.maxPressurePsi, units.pressure)}`]
                  : []),
                ...(typeof f.endStroke?.maxPressurePsi === 'number'
                  ? [`end-stroke maximum ${formatPsi(f.endStroke.maxPressurePsi, units.pressure)}`]
                  : []),
              ]
            : []),
        ].join(', ')
      : 'none',
  });
  const s = input.shock;
  lines.push({
    label: 'Rear',
    text: s
      ? [
          `${formatQuantity('length', s.wheelTravelMm, units)} wheel travel`,
          `${formatQuantity('length', s.strokeMm, units)} stroke`,
          s.spring,
          ...(s.spring === 'air' ? [`${s.spacers} spacer${s.spacers === 1 ? '' : 's'}`] : []),
          ...(s.spring === 'air' && typeof s.maxPressurePsi === 'number'
            ? [`maximum ${formatPsi(s.maxPressurePsi, units.pressure)}`]
            : []),
          ...(typeof s.leverageRatioAtSag === 'number'
            ? [`leverage ratio at sag ${formatNumber(s.leverageRatioAtSag, 2)}`]
            : []),
        ].join(', ')
      : 'none (hardtail)',
  });
  const c = input.conditions;
  if (c && (c.altitudeM !== undefined || c.pumpAltitudeM !== undefined || c.temperatureC !== undefined)) {
    const ride = c.altitudeM ?? 0;
    const bits: string[] = [];
    if (c.pumpAltitudeM !== undefined && c.pumpAltitudeM !== ride)
      bits.push(
        `pumped at ${formatQuantity('altitude', c.pumpAltitudeM, units)}`,
        `riding at ${formatQuantity('altitude', ride, units)}`,
      );
    else if (c.altitudeM !== undefined || c.pumpAltitudeM !== undefined)
      bits.push(`pumped and riding at ${formatQuantity('altitude', c.pumpAltitudeM ?? ride, units)}`);
    if (c.temperatureC !== undefined) bits.push(formatQuantity('temperature', c.temperatureC, units));
    lines.push({ label: 'Conditions', text: bits.join(', ') });
  }
  return lines;
}

/** The inputs as a definition list: label and text, one pair a row (two pairs a row from md up). */
export function InputSummaryList({ input, units }: { input: BaselineInput; units: UnitPrefs }) {
  return (
    <Box
      component="dl"
      aria-label="What was entered"
      sx={{
        m: 0,
        display: 'grid',
        gridTemplateColumns: { xs: 'auto 1fr', md: 'auto 1fr auto 1fr' },
        columnGap: 2,
        rowGap: 0.5,
      }}
    >
      {describeInput(input, units).map((l) => (
        <Box key={l.label} sx={{ display: 'contents' }}>
          <Typography component="dt" variant="body2" sx={{ fontWeight: 700 }}>
            {l.label}
          </Typography>
          <Typography component="dd" variant="body2" sx={{ m: 0 }}>
            {l.text}
          </Typography>
        </Box>
      ))}
    </Box>
  );
}
