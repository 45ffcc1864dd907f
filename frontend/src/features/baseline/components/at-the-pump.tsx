import type { BaselineInput, BaselineResult, PartResult } from '@loamline/shared-types';
import Box from '@mui/material/Box';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { formatNumber, formatQuantity, type UnitPrefs } from '@/lib/units';
import { formatPsi, formatPsiRange } from './part-result';

function Steps({ children }: { children: ReactNode }) {
  return (
    <Box
      component="ol"
      sx={{
        m: 0,
        pl: 3,
        '& > li': { mb: 1, pl: 0.5, fontSize: '0.95rem', lineHeight: 1.5 },
        '& > li::marker': { fontWeight: 700, color: 'primary.main' },
      }}
    >
      {children}
    </Box>
  );
}

function AirPart({
  name,
  result,
  endStrokePsi,
  units,
  sagWhere,
}: {
  name: string;
  result: PartResult;
  endStrokePsi?: number;
  units: UnitPrefs;
  sagWhere: string;
}) {
  if (!result.pressure) return null;
  const p = formatPsi(result.pressure.psi, units.pressure);
  return (
    <Stack spacing={1}>
      <Typography variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
        {name}
      </Typography>
      <Steps>
        <li>
          Let <b>all</b> the air out of the main chamber: take off the valve cap and press the valve core
          until nothing more comes out. Push the {name.toLowerCase()} through its travel a few times and let
          out what is left: air can hide in the negative chamber.
        </li>
        {endStrokePsi !== undefined && (
          <li>
            <b>End-stroke chamber first:</b> set it to <b>{formatPsi(endStrokePsi, units.pressure)}</b>{' '}
            through its own valve. It can hold far more pressure than the main chamber: use a pump rated for
            it, and only ever fill or empty it through that valve.
          </li>
        )}
        <li>
          {endStrokePsi !== undefined ? 'Then the main chamber: pump' : 'Pump the main chamber'} to <b>{p}</b>{' '}
          (range {formatPsiRange(result.pressure.rangePsi, units.pressure)}).
        </li>
        <li>
          Cycle the suspension: push it through about half its travel ten times so the chambers settle, then
          check the gauge again and top up to {p}.
        </li>
        <li>
          Measure sag (see below): aim for <b>{formatQuantity('length', result.targetSagMm, units)}</b>{' '}
          {sagWhere} ({formatNumber(result.targetSagPct, 0)} %
          {'wheelSagMm' in result && typeof result.wheelSagMm === 'number'
            ? `; ${formatQuantity('length', result.wheelSagMm, units)} at the wheel`
            : ''}
          ).
        </li>
      </Steps>
    </Stack>
  );
}

function CoilPart({ name, result, units }: { name: string; result: PartResult; units: UnitPrefs }) {
  if (!result.coilRate) return null;
  return (
    <Stack spacing={1}>
      <Typography variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
        {name} (coil)
      </Typography>
      <Steps>
        <li>
          Fit the nearest stocked spring: <b>{formatNumber(result.coilRate.suggestedLbPerIn, 0)} lb/in</b>{' '}
          (worked out: {formatNumber(result.coilRate.lbPerIn, 0)} lb/in,{' '}
          {formatNumber(result.coilRate.nPerMm, 1)} N/mm). A spring swap is workshop work: follow the
          maker&apos;s manual.
        </li>
        <li>Set the preload only as far as the manual allows; preload is not a way to fix a wrong spring.</li>
        <li>
          Measure sag (see below): aim for <b>{formatQuantity('length', result.targetSagMm, units)}</b> (
          {formatNumber(result.targetSagPct, 0)} %).
        </li>
      </Steps>
    </Stack>
  );
}

/**
 * The order of work with the numbers of this baseline filled in, and how to measure sag. With coil
 * springs only, there is no pump: the card is about fitting the springs instead.
 */
export function AtThePump({
  input,
  result,
  units,
}: {
  input: BaselineInput;
  result: BaselineResult;
  units: UnitPrefs;
}) {
  const air = !!(result.fork?.pressure || result.shock?.pressure);
  return (
    <Card component="section" aria-labelledby="pump-title" className="sheet-pump">
      <CardContent>
        <Stack spacing={2.5}>
          <Typography variant="h3" id="pump-title">
            {air ? 'At the pump' : 'Fitting the springs'}
          </Typography>
          <Box
            className="sheet-pump-parts"
            sx={{
              display: 'grid',
              gap: 3,
              gridTemplateColumns: { xs: '1fr', md: result.fork && result.shock ? '1fr 1fr' : '1fr' },
            }}
          >
            {result.fork &&
              (result.fork.pressure ? (
                <AirPart
                  name="Fork"
                  result={result.fork}
                  endStrokePsi={input.fork?.endStroke?.pressurePsi}
                  units={units}
                  sagWhere="on the stanchion"
                />
              ) : (
                <CoilPart name="Fork" result={result.fork} units={units} />
              ))}
            {result.shock &&
              (result.shock.pressure ? (
                <AirPart name="Shock" result={result.shock} units={units} sagWhere="on the shock shaft" />
              ) : (
                <CoilPart name="Shock" result={result.shock} units={units} />
              ))}
          </Box>
          <Box sx={{ bgcolor: 'background.default', borderRadius: 1, p: 2 }} className="sheet-how-to">
            <Typography variant="subtitle1" component="h4" sx={{ fontWeight: 700, mb: 1 }}>
              How to measure sag
            </Typography>
            <Steps>
              <li>Wear your riding gear. Set the compression adjusters fully open, if there are any.</li>
              <li>
                Lean against a wall or have a friend hold the bike. Stand on the pedals in your riding
                position, heels down, weight centred.
              </li>
              <li>
                Bounce gently a few times, settle, and push the rubber rings (or a zip tie) against the seals.
              </li>
              <li>
                Step off forwards without sitting or bouncing, so the rings stay where the bike sank to.
              </li>
              <li>
                Measure from the seal to the ring: the fork on the stanchion, the shock on its shaft. That
                distance is the sag.
              </li>
              <li>
                {air
                  ? 'Put what you measured into the Sag check step: it tells you how much air to add or let out.'
                  : 'Compare it with the target above: a coil spring that sags far more or less needs the next rate up or down.'}
              </li>
            </Steps>
          </Box>
        </Stack>
      </CardContent>
    </Card>
  );
}
