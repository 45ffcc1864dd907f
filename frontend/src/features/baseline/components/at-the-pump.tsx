import type { BaselineInput, BaselineResult, PartResult } from '@loamline/shared-types';
import Box from '@mui/material/Box';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { formatNumber, formatQuantity, type UnitPrefs } from '@/lib/units';
import { formatPsi, formatPsiRange } from './pressure-text';
import { maximaOf, pressureSafety, WarningList } from './warnings';

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

/** "(your maximum)" or "(Loamline's default maximum: check the one printed on it)" */
const whoseMax = (isDefault: boolean, name: string): string =>
  isDefault
    ? `Loamline's default: check the one printed on your ${name.toLowerCase()}`
    : 'the maximum you entered';

function AirPart({
  name,
  part,
  result,
  units,
  sagWhere,
}: {
  name: string;
  part: 'fork' | 'shock';
  result: PartResult;
  units: UnitPrefs;
  sagWhere: string;
}) {
  const { mainBlocked, endStrokeBlocked } = pressureSafety(result);
  const maxima = maximaOf(part, result);
  const heading = (
    <Typography variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
      {name}
    </Typography>
  );
  if (!result.pressure || mainBlocked) {
    // a blocking error: no order of work that ends in a pressure past a maximum
    return (
      <Stack spacing={1} data-testid={`${part}-pump-blocked`}>
        {heading}
        <WarningList warnings={result.warnings} maxima={maxima} units={units} only={['error']} />
        <Typography variant="body2">
          Don&apos;t pump this {name.toLowerCase()} to the worked-out pressure. Keep it at or below its
          maximum and ask a qualified technician: the spring may not suit you as it is (a different air
          spring, fewer spacers or a coil can).
        </Typography>
      </Stack>
    );
  }
  const pressure = result.pressure;
  const p = formatPsi(pressure.psi, units.pressure);
  const main = maxima.main;
  const [lo, hi] = pressure.rangePsi;
  const range =
    main && hi > main.psi
      ? `${formatPsiRange([lo, main.psi], units.pressure)}, never past the maximum`
      : formatPsiRange(pressure.rangePsi, units.pressure, pressure.rangeBar);
  const atRide = typeof pressure.atRidePsi === 'number' ? pressure.atRidePsi : null;
  const e = result.endStroke ?? null;
  return (
    <Stack spacing={1}>
      {heading}
      <Steps>
        <li>
          Let <b>all</b> the air out of the main chamber: take off the valve cap and press the valve core
          until nothing more comes out. Push the {name.toLowerCase()} through its travel a few times and let
          out what is left: air can hide in the negative chamber.
        </li>
        {e &&
          (endStrokeBlocked ? (
            <li data-testid="end-stroke-step">
              <b>End-stroke chamber:</b> don&apos;t set {formatPsi(e.psi, units.pressure)}: it is past the
              chamber&apos;s maximum of <b>{formatPsi(e.maxPsi, units.pressure)}</b> (
              {whoseMax(e.maxIsDefault, name)}).{' '}
              {e.recommendedPsi <= e.maxPsi
                ? `Set the recommended ${formatPsi(e.recommendedPsi, units.pressure)} instead, through its own valve.`
                : 'Leave it as it is and ask a technician.'}
            </li>
          ) : (
            <li data-testid="end-stroke-step">
              <b>End-stroke chamber first:</b> set it to <b>{formatPsi(e.psi, units.pressure)}</b>{' '}
              {e.given ? '(the pressure you entered)' : '(the recommended pressure: you left it empty)'}{' '}
              through its own valve, never past its maximum of {formatPsi(e.maxPsi, units.pressure)} (
              {whoseMax(e.maxIsDefault, name)}). It can hold far more pressure than the main chamber: use a
              pump rated for it, and only ever fill or empty it through that valve.
            </li>
          ))}
        <li>
          {e ? 'Then the main chamber: pump' : 'Pump the main chamber'} to <b>{p}</b> (range {range}
          {main
            ? `; never past ${formatPsi(main.psi, units.pressure)}, ${whoseMax(main.isDefault, name)}`
            : ''}
          ).
          {atRide !== null && (
            <>
              {' '}
              That is the gauge reading where you pump. Where you ride, the same air reads about{' '}
              <b>{formatPsi(atRide, units.pressure)}</b>: leave it as it is there.
            </>
          )}
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
  result,
  units,
}: {
  /** the input the result is for (kept for callers; the result carries what the steps need) */
  input?: BaselineInput;
  result: BaselineResult;
  units: UnitPrefs;
}) {
  const air = !!((result.fork && !result.fork.coilRate) || (result.shock && !result.shock.coilRate));
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
              (!result.fork.coilRate ? (
                <AirPart
                  name="Fork"
                  part="fork"
                  result={result.fork}
                  units={units}
                  sagWhere="on the stanchion"
                />
              ) : (
                <CoilPart name="Fork" result={result.fork} units={units} />
              ))}
            {result.shock &&
              (!result.shock.coilRate ? (
                <AirPart
                  name="Shock"
                  part="shock"
                  result={result.shock}
                  units={units}
                  sagWhere="on the shock shaft"
                />
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
                Lean against a wall or have a friend hold the bike. For the fork, stand on the pedals in your
                riding position, heels down, weight centred; for the shock, sit on the saddle with your feet
                on the pedals.
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
