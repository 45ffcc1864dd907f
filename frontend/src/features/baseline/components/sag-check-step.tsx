import type { BaselineResult, SagCheckResult } from '@loamline/shared-types';
import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useCallback, useEffect, useMemo, useRef } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { z } from 'zod';
import { ApiRequestError } from '@/lib/api-client';
import { barToPsi, formatNumber, formatQuantity, psiToBar, round, type UnitPrefs } from '@/lib/units';
import { pine } from '@/theme/primitives';
import { useSagCheck } from '../api/sag-check';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { ChoiceField, NumberField } from './form-fields';
import { formatPsi } from './part-result';
import { StepTitle } from './step-title';

type Part = 'fork' | 'shock';

interface SagValues {
  part: Part;
  sagMm: number;
  pressurePsi: number;
}

function sagSchema(result: BaselineResult | undefined, units: UnitPrefs) {
  const number = z.union([z.number(), z.nan()]);
  return z
    .object({ part: z.enum(['fork', 'shock']), sagMm: number, pressurePsi: number })
    .superRefine((v, ctx) => {
      const travel = v.part === 'fork' ? result?.fork?.travelMm : result?.shock?.travelMm;
      if (!Number.isFinite(v.sagMm))
        ctx.addIssue({ code: 'custom', path: ['sagMm'], message: 'Enter the sag you measured' });
      else if (v.sagMm <= 0) ctx.addIssue({ code: 'custom', path: ['sagMm'], message: 'More than zero' });
      else if (travel && v.sagMm >= travel)
        ctx.addIssue({
          code: 'custom',
          path: ['sagMm'],
          message: `Less than the travel, ${formatQuantity('length', travel, units)}`,
        });
      if (!Number.isFinite(v.pressurePsi))
        ctx.addIssue({
          code: 'custom',
          path: ['pressurePsi'],
          message: 'Enter the pressure you measured at',
        });
      else if (v.pressurePsi < 1 || v.pressurePsi > 1000)
        ctx.addIssue({
          code: 'custom',
          path: ['pressurePsi'],
          message: `Between ${formatPsi(1, units.pressure)} and ${formatPsi(1000, units.pressure)}`,
        });
    });
}

/** The change as a pump reads it; zero when it rounds away. */
function shownChange(psi: number, units: UnitPrefs): number {
  return units.pressure === 'bar' ? round(psiToBar(psi), 1) : round(psi, 0);
}

function Advice({ answer, part, units }: { answer: SagCheckResult; part: Part; units: UnitPrefs }) {
  const change = shownChange(answer.changePsi, units);
  const amount = formatPsi(Math.abs(answer.changePsi), units.pressure);
  const headline =
    change === 0
      ? `On target: leave it at ${formatPsi(answer.newPressurePsi, units.pressure)}`
      : change > 0
        ? `Add ${amount}`
        : `Let out ${amount}`;
  return (
    <Box
      role="status"
      aria-live="polite"
      sx={{
        bgcolor: pine[50],
        border: 2,
        borderColor: 'primary.main',
        borderRadius: 1,
        p: { xs: 2, sm: 3 },
      }}
    >
      <Typography
        sx={{ fontSize: '1.9rem', fontWeight: 700, color: pine[700], lineHeight: 1.2 }}
        data-testid="sag-advice"
      >
        {headline}
      </Typography>
      {change !== 0 && (
        <Typography sx={{ mt: 0.5, fontSize: '1.1rem' }}>
          New pressure: <b>{formatPsi(answer.newPressurePsi, units.pressure)}</b>
        </Typography>
      )}
      <Typography variant="body2" color="text.secondary" sx={{ mt: 1.5 }}>
        You measured {formatNumber(answer.measuredSagPct, 1)} % sag; the target is{' '}
        {formatQuantity('length', answer.targetSagMm, units)}
        {part === 'shock' ? ' at the shock' : ''}. Change the pressure, cycle the suspension ten times, and
        measure again: a second check lands closer.
      </Typography>
    </Box>
  );
}

/** Sag measured at a pressure in; how much air to add or let out, from the server. */
export function SagCheckStep() {
  const { request, result, units } = useBaselineWizard();
  const parts = useMemo(
    () =>
      (['fork', 'shock'] as const).filter((p) => {
        const r = result?.[p];
        return r && r.pressure;
      }),
    [result],
  );
  const resolver = useMemo(() => zodResolver(sagSchema(result, units)), [result, units]);
  const first = parts[0] ?? 'fork';
  const startPsi = useCallback(
    (p: Part): number => {
      const psi = result?.[p]?.pressure?.psi;
      if (psi === undefined) return Number.NaN;
      // what the rider pumped to: the baseline as the screen rounded it
      return units.pressure === 'bar' ? barToPsi(round(psiToBar(psi), 1)) : round(psi, 0);
    },
    [result, units.pressure],
  );
  const form = useForm<SagValues>({
    defaultValues: { part: first, sagMm: Number.NaN, pressurePsi: startPsi(first) },
    resolver,
    mode: 'onTouched',
  });
  const part = useWatch({ control: form.control, name: 'part' });
  const check = useSagCheck();
  const { reset: resetCheck } = check;
  const { setValue } = form;
  const lastPart = useRef(part);
  useEffect(() => {
    if (lastPart.current === part) return;
    lastPart.current = part;
    // another part: its own baseline pressure, and the last advice no longer applies
    setValue('pressurePsi', startPsi(part));
    setValue('sagMm', Number.NaN);
    resetCheck();
  }, [part, setValue, resetCheck, startPsi]);

  if (!request || !result) return null;
  if (!parts.length) {
    return (
      <Stack spacing={3}>
        <StepTitle title="Sag check" />
        <Alert severity="info">
          The sag check corrects an air pressure. With coil springs, a sag far from the target means a
          different spring rate: see the rate on your baseline, and ask a technician.
        </Alert>
      </Stack>
    );
  }

  const submit = form.handleSubmit(async (v) => {
    try {
      await check.trigger({
        ...request,
        measured: { part: v.part, pressurePsi: v.pressurePsi, sagMm: v.sagMm },
      });
    } catch {
      // the error stays on the hook and is shown below
    }
  });
  const partResult = result[part];
  const error = check.error;
  const serverFields =
    error instanceof ApiRequestError && error.status === 400 ? error.body.fields : undefined;

  return (
    <Stack spacing={3}>
      <StepTitle
        title="Sag check"
        lead="Set the baseline, measure sag as the At the pump steps say, and put in what you found."
      />
      <Card>
        <CardContent>
          <Stack
            component="form"
            spacing={2.5}
            noValidate
            onSubmit={(e) => void submit(e)}
            aria-label="Sag check"
          >
            {parts.length > 1 && (
              <ChoiceField<SagValues, Part>
                control={form.control}
                name="part"
                label="Which did you measure?"
                layout="row"
                choices={parts.map((p) => ({ value: p, label: p === 'fork' ? 'Fork' : 'Rear shock' }))}
              />
            )}
            <NumberField
              control={form.control}
              name="sagMm"
              label={part === 'fork' ? 'Sag measured on the stanchion' : 'Sag measured on the shock shaft'}
              display={{ quantity: 'length', prefs: units }}
              helperText={
                partResult
                  ? `Target ${formatQuantity('length', partResult.targetSagMm, units)}${part === 'shock' ? ' at the shock' : ''}`
                  : undefined
              }
            />
            <NumberField
              control={form.control}
              name="pressurePsi"
              label="Pressure it was measured at"
              display={{ quantity: 'pressure', prefs: units }}
              helperText="What the gauge read before you measured"
            />
            <Button type="submit" variant="contained" size="large" disabled={check.isMutating}>
              {check.isMutating ? 'Checking…' : 'Check my sag'}
            </Button>
          </Stack>
        </CardContent>
      </Card>
      {error && (
        <Alert severity="error" role="alert">
          {error instanceof ApiRequestError
            ? serverFields
              ? Object.entries(serverFields)
                  .map(([k, m]) => `${k}: ${m}`)
                  .join('; ')
              : error.message
            : 'Loamline could not reach the server. Check your connection and try again.'}
        </Alert>
      )}
      {check.data && !error && <Advice answer={check.data} part={part} units={units} />}
    </Stack>
  );
}
