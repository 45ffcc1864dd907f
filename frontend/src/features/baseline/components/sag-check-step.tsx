import { BASELINE_LIMITS, type BaselineResult, type SagCheckResult } from '@loamline/shared-types';
import { zodResolver } from '@hookform/resolvers/zod';
import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import PrintIcon from '@mui/icons-material/Print';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useCallback, useEffect, useMemo, useRef, type ReactNode } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { z } from '@/lib/zod';
import { ApiRequestError } from '@/lib/api-client';
import { barToPsi, formatNumber, formatQuantity, psiToBar, round, type UnitPrefs } from '@/lib/units';
import { pine } from '@/theme/primitives';
import { useSagCheck } from '../api/sag-check';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { ChoiceField, NumberField } from './form-fields';
import type { BaselineStepProps } from './baseline-step';
import { riderText } from './plain-text';
import { formatPsi } from './pressure-text';
import { isBlocked, pressureSafety, WarningList } from './warnings';
import { StepTitle } from './step-title';

type Part = 'fork' | 'shock';

interface SagValues {
  part: Part;
  sagMm: number;
  pressurePsi: number;
}

const M = BASELINE_LIMITS;

function sagSchema(result: BaselineResult | undefined, units: UnitPrefs) {
  const number = z.union([z.number(), z.nan()]);
  return z.object({ part: z.enum(['fork', 'shock']), sagMm: number, pressurePsi: number }).check(
    z.superRefine((v, ctx) => {
      const travel = v.part === 'fork' ? result?.fork?.travelMm : result?.shock?.travelMm;
      if (!Number.isFinite(v.sagMm))
        ctx.addIssue({ code: 'custom', path: ['sagMm'], message: 'Enter the sag you measured' });
      else if (v.sagMm < M.measuredSagMm.min)
        ctx.addIssue({
          code: 'custom',
          path: ['sagMm'],
          message: `At least ${formatQuantity('length', M.measuredSagMm.min, units, 1)}`,
        });
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
      else if (v.pressurePsi < M.measuredPressurePsi.min)
        ctx.addIssue({
          code: 'custom',
          path: ['pressurePsi'],
          message: `At least ${formatPsi(M.measuredPressurePsi.min, units.pressure)}: enter what the gauge read`,
        });
      else if (v.pressurePsi > M.measuredPressurePsi.max) {
        // not "between … and 1,000 psi": that would read as a pressure a fork may hold
        const max = (v.part === 'fork' ? result?.fork : result?.shock)?.pressure?.maxPsi;
        ctx.addIssue({
          code: 'custom',
          path: ['pressurePsi'],
          message: `More than any ${v.part === 'fork' ? 'fork' : 'shock'} holds${max ? `; the maximum is ${formatPsi(max, units.pressure)}` : ''}. Check the gauge reading and its unit (psi or bar).`,
        });
      }
    }),
  );
}

/** The change as a pump reads it; zero when it rounds away. */
function shownChange(psi: number, units: UnitPrefs): number {
  return units.pressure === 'bar' ? round(psiToBar(psi), 1) : round(psi, 0);
}

/**
 * The answer: its warnings first (an error, e.g. a pressure past the maximum, before any number),
 * then how much air to add or let out. A blocked answer never reads as something to pump.
 */
function Advice({ answer, part, units }: { answer: SagCheckResult; part: Part; units: UnitPrefs }) {
  const warnings = Array.isArray(answer.warnings) ? answer.warnings : [];
  const max = typeof answer.maxPsi === 'number' ? answer.maxPsi : undefined;
  const maxima =
    max === undefined ? {} : { main: { chamber: part, psi: max, isDefault: answer.maxIsDefault !== false } };
  const newPsi = answer.newPressurePsi;
  const blocked = isBlocked(warnings) || newPsi === null || (max !== undefined && newPsi > max + 1e-9);
  const sagLine = (
    <Typography variant="body2" color="text.secondary" sx={{ mt: 1.5 }}>
      You measured {formatNumber(answer.measuredSagPct, 1)} % sag; the target is{' '}
      {formatQuantity('length', answer.targetSagMm, units)}
      {part === 'shock' ? ' at the shock' : ''}
      {typeof answer.targetSagPct === 'number' ? ` (${formatNumber(answer.targetSagPct, 0)} %)` : ''}.
    </Typography>
  );
  let box: ReactNode;
  if (blocked) {
    box = (
      <Box
        data-testid="sag-advice-blocked"
        sx={{
          bgcolor: 'background.paper',
          border: 2,
          borderColor: 'error.main',
          borderRadius: 1,
          p: { xs: 2, sm: 3 },
        }}
      >
        <Typography sx={{ fontSize: '1.35rem', fontWeight: 700, color: 'error.dark', lineHeight: 1.25 }}>
          No safe pressure reaches the target sag
        </Typography>
        {newPsi !== null && (
          <Typography sx={{ mt: 1 }} data-testid="sag-worked-out">
            Worked out: {formatPsi(newPsi, units.pressure)}
            {max !== undefined && newPsi > max ? `, past the ${formatPsi(max, units.pressure)} maximum` : ''}.
            Do not set it.
          </Typography>
        )}
        <Typography variant="body2" sx={{ mt: 1 }}>
          {max !== undefined ? `Keep it at or below ${formatPsi(max, units.pressure)}. ` : ''}Measure the sag
          once more (riding gear on, in your riding position, the ring pushed to the seal). If it is right,
          this spring does not suit your weight as it is: ask a qualified technician, and follow the
          maker&apos;s manual.
        </Typography>
        {sagLine}
      </Box>
    );
  } else {
    const change = shownChange(answer.changePsi ?? 0, units);
    const amount = formatPsi(Math.abs(answer.changePsi ?? 0), units.pressure);
    const headline =
      change === 0
        ? `On target: leave it at ${formatPsi(newPsi, units.pressure)}`
        : change > 0
          ? `Add ${amount}`
          : `Let out ${amount}`;
    box = (
      <Box
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
            New pressure: <b>{formatPsi(newPsi, units.pressure)}</b>
          </Typography>
        )}
        {max !== undefined && (
          <Typography variant="body2" sx={{ mt: 0.5 }}>
            Never past {formatPsi(max, units.pressure)} (
            {answer.maxIsDefault !== false ? "Loamline's default maximum: check yours" : 'your maximum'}).
          </Typography>
        )}
        {sagLine}
        <Typography variant="body2" color="text.secondary" sx={{ mt: 0.5 }}>
          Change the pressure, cycle the suspension ten times, and measure again: a second check lands closer.
        </Typography>
      </Box>
    );
  }
  return (
    <Stack spacing={2} role="status" aria-live="polite" data-testid="sag-answer">
      <WarningList warnings={warnings} maxima={maxima} units={units} />
      {box}
    </Stack>
  );
}

/** What the server's 400 names, as the sag check's own fields. */
const MEASURED_FIELDS: Record<string, keyof SagValues> = {
  'measured.pressurePsi': 'pressurePsi',
  'measured.sagMm': 'sagMm',
  'measured.part': 'part',
};

const capital = (m: string): string => m.charAt(0).toUpperCase() + m.slice(1);

/** When the check is done: keep the baseline as a sheet, print it, or go back to it. */
function DoneActions({ sheetActions }: Pick<BaselineStepProps, 'sheetActions'>) {
  const { request, result, goTo } = useBaselineWizard();
  if (!request || !result) return null;
  return (
    <Card component="section" aria-labelledby="sag-done-title" className="no-print">
      <CardContent>
        <Typography variant="h3" id="sag-done-title" gutterBottom>
          Done?
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
          Keep the baseline to come back to, print it for the workshop, or look at it again.
        </Typography>
        <Stack direction={{ xs: 'column', sm: 'row' }} spacing={1.5} sx={{ flexWrap: 'wrap' }}>
          {sheetActions?.({ input: request, result })}
          <Button
            variant="outlined"
            size="large"
            startIcon={<PrintIcon />}
            onClick={() => {
              // the sheet is the Baseline step: show it, then print it
              goTo('baseline');
              window.setTimeout(() => window.print(), 400);
            }}
          >
            Print baseline sheet
          </Button>
          <Button variant="text" size="large" startIcon={<ArrowBackIcon />} onClick={() => goTo('baseline')}>
            Back to the baseline
          </Button>
        </Stack>
      </CardContent>
    </Card>
  );
}

/** Sag measured at a pressure in; how much air to add or let out, from the server. */
export function SagCheckStep({ sheetActions }: Pick<BaselineStepProps, 'sheetActions'> = {}) {
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
      const r = result?.[p];
      const psi = r?.pressure?.psi;
      // a pressure past a maximum is not one the rider pumped to: nothing is filled in then
      if (!r || psi === undefined || pressureSafety(r).mainBlocked) return Number.NaN;
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
  const sagMm = useWatch({ control: form.control, name: 'sagMm' });
  const pressurePsi = useWatch({ control: form.control, name: 'pressurePsi' });
  const check = useSagCheck();
  const { reset: resetCheck } = check;
  const { setValue } = form;
  // the measurement the shown answer (or refusal) is about: once the rider changes it, the answer
  // no longer matches what the fields say and is taken away until they check again
  const asked = useRef<{ sagMm: number; pressurePsi: number } | null>(null);
  useEffect(() => {
    const a = asked.current;
    if (!a) return;
    if (Object.is(a.sagMm, sagMm) && Object.is(a.pressurePsi, pressurePsi)) return;
    asked.current = null;
    resetCheck();
  }, [sagMm, pressurePsi, resetCheck]);
  const lastPart = useRef(part);
  useEffect(() => {
    if (lastPart.current === part) return;
    lastPart.current = part;
    asked.current = null;
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
        {result.fork?.coilRate || result.shock?.coilRate ? (
          <Alert severity="info">
            The sag check corrects an air pressure. With coil springs, a sag far from the target means a
            different spring rate: see the rate on your baseline, and ask a technician.
          </Alert>
        ) : (
          <Alert severity="error">
            No air pressure in this spring carries you at the target sag (see your baseline), so there is
            nothing to check. Ask a qualified technician.
          </Alert>
        )}
      </Stack>
    );
  }

  const submit = form.handleSubmit(async (v) => {
    asked.current = { sagMm: v.sagMm, pressurePsi: v.pressurePsi };
    try {
      await check.trigger({
        ...request,
        measured: { part: v.part, pressurePsi: v.pressurePsi, sagMm: v.sagMm },
      });
    } catch (e) {
      // a measurement the server finds implausible: its message goes on that field
      const fields = e instanceof ApiRequestError && e.status === 400 ? (e.body.fields ?? {}) : {};
      for (const [name, message] of Object.entries(fields)) {
        const field = MEASURED_FIELDS[name];
        if (field)
          form.setError(
            field,
            { type: 'server', message: capital(riderText(message, units)) },
            { shouldFocus: true },
          );
      }
    }
  });
  const partResult = result[part];
  const error = check.error;
  const serverFields =
    error instanceof ApiRequestError && error.status === 400 ? (error.body.fields ?? {}) : undefined;
  // what the fields do not show: a message about another input, or the whole request
  const unplaced = serverFields ? Object.entries(serverFields).filter(([k]) => !MEASURED_FIELDS[k]) : [];
  const showAlert = !!error && (!serverFields || unplaced.length > 0 || !Object.keys(serverFields).length);

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
      {showAlert && (
        <Alert severity="error" role="alert">
          {error instanceof ApiRequestError
            ? unplaced.length
              ? unplaced.map(([, m]) => capital(riderText(m, units))).join(' ')
              : error.message
            : 'Loamline could not reach the server. Check your connection and try again.'}
        </Alert>
      )}
      {check.data && !error && (
        <>
          <Advice answer={check.data} part={part} units={units} />
          <DoneActions sheetActions={sheetActions} />
        </>
      )}
    </Stack>
  );
}
