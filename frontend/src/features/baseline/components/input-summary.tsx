import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { BaselineInput } from '@loamline/shared-types';
import { formatNumber, formatQuantity, type UnitPrefs } from '@/lib/units';
import { FEEL_CHOICES, STYLE_CHOICES } from './riding-step';
import { formatShown } from './form-fields';
import { formatPsi } from './part-result';

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
                !f.endStroke
                  ? 'no end-stroke chamber'
                  : f.endStroke.pressurePsi === undefined
                    ? 'end-stroke chamber, pressure recommended'
                    : `end-stroke chamber at ${formatPsi(f.endStroke.pressurePsi, units.pressure)}`,
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
        ].join(', ')
      : 'none (hardtail)',
  });
  const c = input.conditions;
  const where = [
    c?.altitudeM !== undefined && `${formatQuantity('altitude', c.altitudeM, units)} altitude`,
    c?.pumpAltitudeM !== undefined && `pumped at ${formatQuantity('altitude', c.pumpAltitudeM, units)}`,
    c?.temperatureC !== undefined && formatQuantity('temperature', c.temperatureC, units),
  ].filter((x): x is string => !!x);
  if (where.length) lines.push({ label: 'Conditions', text: where.join(', ') });
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
