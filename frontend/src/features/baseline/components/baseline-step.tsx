import type { Assumption, BaselineInput, BaselineResult } from '@loamline/shared-types';
import ExpandMoreIcon from '@mui/icons-material/ExpandMore';
import PrintIcon from '@mui/icons-material/Print';
import Accordion from '@mui/material/Accordion';
import AccordionDetails from '@mui/material/AccordionDetails';
import AccordionSummary from '@mui/material/AccordionSummary';
import ReportProblemIcon from '@mui/icons-material/ReportProblem';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import LinearProgress from '@mui/material/LinearProgress';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useEffect, type ReactNode } from 'react';
import { formatNumber, PA_PER_PSI, psiToBar, quantityOfApiUnit, type UnitPrefs } from '@/lib/units';
import { ApiRequestError } from '@/lib/api-client';
import { ochre, pine } from '@/theme/primitives';
import type { BaselineField } from '../form';
import { serverFieldErrors, useBaselineWizard } from '../hooks/use-baseline-wizard';
import { assumedValue, geometryDisplay } from './advanced-panel';
import { AtThePump } from './at-the-pump';
import { formatShown, type NumberDisplay } from '../utils/number-display';
import { HowItWorks } from './how-it-works';
import { InputSummaryList } from './input-summary';
import { PartResultCard } from './part-result';
import { riderText } from './plain-text';

/** How an assumption's value reads, in the rider's units where it is one of the form's quantities. */
export function assumptionText(a: Assumption, units: UnitPrefs): string {
  if (typeof a.value !== 'number') return `${a.value}${a.unit ? ` ${a.unit}` : ''}`;
  // the air around you, in pascals in the model: a rider reads it as a gauge unit, not "101,325 Pa"
  if (a.unit === 'Pa') {
    const psi = a.value / PA_PER_PSI;
    return units.pressure === 'bar' ? `${formatNumber(psiToBar(psi), 2)} bar` : `${formatNumber(psi, 1)} psi`;
  }
  const geometry = /^(fork|shock)\.geometry\.(\w+)$/.exec(a.key);
  const quantity = quantityOfApiUnit(a.unit);
  let display: NumberDisplay | null = null;
  if (geometry) display = geometryDisplay(geometry[2] as Parameters<typeof geometryDisplay>[0], units);
  else if (a.key === 'rider.frontShare') display = { percentOfFraction: true };
  else if (quantity) display = { quantity, prefs: units };
  if (display) return formatShown(assumedValue([a], a.key) ?? a.value, display);
  const v = formatNumber(a.value, Number.isInteger(a.value) ? 0 : Math.abs(a.value) < 10 ? 3 : 1).replace(
    /(\.\d*?)0+$/,
    '$1',
  );
  return `${v.replace(/\.$/, '')}${a.unit ? ` ${a.unit}` : ''}`;
}

const ASSUMPTION_GROUPS: { title: string; test: (key: string) => boolean }[] = [
  { title: 'You and where you ride', test: (k) => k.startsWith('rider.') || k.startsWith('conditions.') },
  { title: 'Fork', test: (k) => k.startsWith('fork.') },
  { title: 'Rear shock', test: (k) => k.startsWith('shock.') },
  { title: 'Physics and the model', test: () => true },
];

/**
 * The technical detail, closed until asked for: how the numbers were worked out in plain words, then
 * every default and estimate the result used, grouped, with its source and a way to change it.
 */
function HowWorkedOut({ assumptions }: { assumptions: Assumption[] }) {
  const { form, units, editField } = useBaselineWizard();
  const values = form.getValues();
  const canChange = (key: string): boolean => {
    let v: unknown = values;
    for (const part of key.split('.')) {
      if (!v || typeof v !== 'object') return false;
      v = (v as Record<string, unknown>)[part];
    }
    return typeof v === 'number';
  };
  const left = new Set(assumptions);
  const groups = ASSUMPTION_GROUPS.map((g) => {
    const items = [...left].filter((a) => g.test(a.key));
    items.forEach((a) => left.delete(a));
    return { title: g.title, items };
  }).filter((g) => g.items.length);
  return (
    <Accordion
      component="section"
      aria-labelledby="assumed-title"
      className="sheet-assumed"
      disableGutters
      variant="outlined"
      slotProps={{ heading: { component: 'h3' } }}
      sx={{ borderRadius: '10px !important', '&:before': { display: 'none' } }}
    >
      <AccordionSummary expandIcon={<ExpandMoreIcon />} aria-controls="assumed-content">
        <Box>
          <Typography variant="h3" component="span" id="assumed-title" sx={{ display: 'block' }}>
            How this was worked out
          </Typography>
          <Typography variant="body2" component="span" color="text.secondary" sx={{ display: 'block' }}>
            The physics, and what Loamline assumed where you gave no number
          </Typography>
        </Box>
      </AccordionSummary>
      <AccordionDetails id="assumed-content">
        <HowItWorks />
        <Typography variant="h4" component="h4" sx={{ fontSize: '1.05rem', fontWeight: 700, mt: 3 }}>
          What we assumed
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          Where you did not give a number, Loamline used these. Change one and the baseline is worked out
          again.
        </Typography>
        {groups.map((g) => (
          <Box key={g.title} sx={{ mt: 2 }}>
            <Typography variant="subtitle2" component="h4" sx={{ color: pine[700], fontWeight: 700 }}>
              {g.title}
            </Typography>
            <Box
              component="ul"
              sx={{
                listStyle: 'none',
                m: 0,
                p: 0,
                display: 'grid',
                gridTemplateColumns: { xs: '1fr', md: '1fr 1fr' },
                columnGap: 4,
              }}
            >
              {g.items.map((a) => (
                <Box
                  component="li"
                  key={a.key}
                  sx={{
                    display: 'flex',
                    alignItems: 'flex-start',
                    gap: 1,
                    borderBottom: 1,
                    borderColor: 'divider',
                    py: 1,
                  }}
                >
                  <Box sx={{ flex: 1, minWidth: 0 }}>
                    <Typography variant="body2">{riderText(a.label, units)}</Typography>
                    <Typography variant="body2" sx={{ fontWeight: 700 }}>
                      {assumptionText(a, units)}
                    </Typography>
                    <Typography variant="caption" color="text.secondary" sx={{ display: 'block' }}>
                      Source: {riderText(a.source, units)}
                    </Typography>
                  </Box>
                  {canChange(a.key) && (
                    <Button
                      size="small"
                      variant="outlined"
                      className="no-print"
                      onClick={() => editField(a.key)}
                      aria-label={`Change: ${a.label}`}
                      sx={{ flex: '0 0 auto', mt: 0.5 }}
                    >
                      Change
                    </Button>
                  )}
                </Box>
              ))}
            </Box>
          </Box>
        ))}
      </AccordionDetails>
    </Accordion>
  );
}

function Cautions({ cautions }: { cautions: string[] }) {
  return (
    <Box
      component="section"
      aria-labelledby="cautions-title"
      className="sheet-cautions"
      sx={{ border: 2, borderColor: ochre[500], bgcolor: '#FFF8EA', borderRadius: 1, p: { xs: 2, sm: 3 } }}
    >
      <Stack direction="row" spacing={1} sx={{ alignItems: 'center', mb: 1 }}>
        <ReportProblemIcon sx={{ color: ochre[700] }} />
        <Typography variant="h3" id="cautions-title">
          Before you ride
        </Typography>
      </Stack>
      <Box component="ul" sx={{ m: 0, pl: 3, '& li': { mb: 0.75 } }}>
        {cautions.map((c) => (
          <li key={c}>
            <Typography variant="body2">{riderText(c)}</Typography>
          </li>
        ))}
      </Box>
    </Box>
  );
}

/** What the printed sheet starts with; hidden on screen. */
function SheetHeader() {
  const today = new Intl.DateTimeFormat(undefined, { dateStyle: 'long' }).format(new Date());
  return (
    <Box className="print-only" sx={{ display: 'none' }}>
      <Typography variant="h1" sx={{ fontSize: '1.5rem' }}>
        Loamline baseline sheet
      </Typography>
      <Typography variant="body2">{today}</Typography>
    </Box>
  );
}

function InputSummary({ input, units }: { input: BaselineInput; units: UnitPrefs }) {
  const { goTo } = useBaselineWizard();
  return (
    <Box
      className="sheet-inputs"
      sx={{ bgcolor: 'background.paper', border: 1, borderColor: 'divider', borderRadius: 1, p: 2 }}
    >
      <InputSummaryList input={input} units={units} />
      <Button size="small" className="no-print" sx={{ mt: 1, ml: -1 }} onClick={() => goTo('rider')}>
        Change what I entered
      </Button>
    </Box>
  );
}

function ComputeError({ error }: { error: Error }) {
  const { form, editField, recompute } = useBaselineWizard();
  const fields = serverFieldErrors(error);
  const names = Object.keys(fields);
  useEffect(() => {
    // the server names fields by the contract's paths, which are the form's: show each under its input
    for (const [name, message] of Object.entries(serverFieldErrors(error))) {
      form.setError(name as BaselineField, {
        type: 'server',
        message: message.charAt(0).toUpperCase() + message.slice(1),
      });
    }
  }, [error, form]);
  const status = error instanceof ApiRequestError ? error.status : 0;
  return (
    <Alert severity="error" role="alert">
      <AlertTitle>
        {status === 400 ? 'Loamline cannot work out a baseline from this' : 'No baseline this time'}
      </AlertTitle>
      {status === 0 && !(error instanceof ApiRequestError)
        ? 'Loamline could not reach the server. Check your connection and try again.'
        : error.message}
      <Stack direction="row" spacing={1} sx={{ mt: 1.5, flexWrap: 'wrap' }}>
        {names.length > 0 ? (
          <Button variant="outlined" color="inherit" onClick={() => editField(names[0])}>
            Fix it
          </Button>
        ) : (
          <Button variant="outlined" color="inherit" onClick={() => void recompute()}>
            Try again
          </Button>
        )}
      </Stack>
    </Alert>
  );
}

export interface BaselineStepProps {
  /**
   * Buttons beside Print (e.g. "Save as baseline sheet"), given the input and its result.
   * Keep them out of print with the `no-print` class.
   */
  sheetActions?: (sheet: { input: BaselineInput; result: BaselineResult }) => ReactNode;
}

export function BaselineStep({ sheetActions }: BaselineStepProps) {
  const { request, result, resultError, computing, units } = useBaselineWizard();
  if (!request) return null;
  if (resultError) return <ComputeError error={resultError} />;
  if (!result) {
    return (
      <Stack spacing={2} sx={{ alignItems: 'center', py: 8 }} role="status">
        <CircularProgress />
        <Typography>Working out your baseline…</Typography>
      </Stack>
    );
  }
  return (
    <Stack spacing={3} className="baseline-sheet" aria-busy={computing}>
      {computing && <LinearProgress aria-label="Working out your baseline" />}
      <SheetHeader />
      <Box>
        <Typography variant="h2" sx={{ fontSize: { xs: '1.45rem', sm: '1.75rem' } }} className="no-print">
          Your baseline
        </Typography>
        <Typography color="text.secondary" className="no-print" sx={{ mt: 0.5 }}>
          A starting point worked out from your weight, riding and travel. Set it, measure sag, then ride.
        </Typography>
      </Box>
      <InputSummary input={request} units={units} />
      <Box
        className="sheet-parts"
        sx={{
          display: 'grid',
          gap: 3,
          gridTemplateColumns: { xs: '1fr', md: result.fork && result.shock ? '1fr 1fr' : '1fr' },
        }}
      >
        {result.fork && (
          <PartResultCard
            part="fork"
            result={result.fork}
            units={units}
            fittedSpacers={request.fork?.spacers}
          />
        )}
        {result.shock && (
          <PartResultCard
            part="shock"
            result={result.shock}
            units={units}
            fittedSpacers={request.shock?.spacers}
          />
        )}
      </Box>
      <Cautions cautions={result.cautions} />
      <AtThePump input={request} result={result} units={units} />
      <HowWorkedOut assumptions={result.assumptions} />
      <Stack direction={{ xs: 'column', sm: 'row' }} spacing={1.5} className="no-print">
        <Button variant="outlined" size="large" startIcon={<PrintIcon />} onClick={() => window.print()}>
          Print baseline sheet
        </Button>
        {sheetActions?.({ input: request, result })}
      </Stack>
    </Stack>
  );
}
