import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import ArrowForwardIcon from '@mui/icons-material/ArrowForward';
import RestartAltIcon from '@mui/icons-material/RestartAlt';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Stack from '@mui/material/Stack';
import Step from '@mui/material/Step';
import StepButton from '@mui/material/StepButton';
import Stepper from '@mui/material/Stepper';
import Typography from '@mui/material/Typography';
import {
  Suspense,
  lazy,
  useEffect,
  useRef,
  useState,
  type KeyboardEvent,
  type ReactNode,
  type RefObject,
} from 'react';
import { useWatch } from 'react-hook-form';
import { STEPS } from '../form';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { BaselineStep, type BaselineStepProps } from './baseline-step';
import { BikeStep } from './bike-step';
import { BaselinePrintStyles } from './print-styles';
import { RiderStep } from './rider-step';
import { RidingStep } from './riding-step';
import { SagCheckStep } from './sag-check-step';
import { UnitsControl } from './units-control';
import { inkMuted, line, ochre, pine } from '@/theme/primitives';

const StartOverDialog = lazy(() =>
  import('./start-over-dialog').then((m) => ({ default: m.StartOverDialog })),
);

/** "Step 2 of 5 · Riding" and a bar of five segments: readable on a phone. */
function StepHeader() {
  const { step, goTo, result } = useBaselineWizard();
  const current = STEPS[step];
  return (
    <Box className="no-print">
      <Stack direction="row" sx={{ alignItems: 'center', justifyContent: 'space-between', minHeight: 32 }}>
        <Typography
          variant="body2"
          sx={{ fontWeight: 500, color: 'text.secondary', display: { sm: 'none' } }}
          aria-live="polite"
        >
          Step {step + 1} of {STEPS.length} ·{' '}
          <Box component="span" sx={{ color: 'text.primary' }}>
            {current.label}
          </Box>
        </Typography>
        <StartOver />
      </Stack>
      <Box sx={{ display: { xs: 'flex', sm: 'none' }, gap: 0.75, mt: 1 }} aria-hidden>
        {STEPS.map((s, i) => (
          <Box
            key={s.id}
            sx={{
              flex: 1,
              height: 6,
              borderRadius: 3,
              bgcolor: i < step ? pine[300] : i === step ? pine[500] : line,
            }}
          />
        ))}
      </Box>
      <Stepper
        nonLinear
        activeStep={step}
        sx={{
          display: { xs: 'none', sm: 'flex' },
          // the step numbers are white text on the circle: dark enough circles (theme/contrast.test.ts)
          '& .MuiStepIcon-root': { color: inkMuted },
          '& .MuiStepIcon-root.Mui-active': { color: ochre[700] },
          '& .MuiStepIcon-root.Mui-completed': { color: pine[500] },
        }}
      >
        {STEPS.map((s, i) => (
          <Step key={s.id} completed={i < step}>
            {/* earlier steps can be revisited; later ones only through Next, which checks the inputs */}
            <StepButton onClick={() => goTo(s.id)} disabled={i > step && !(i === 4 && result && step === 3)}>
              {s.label}
            </StepButton>
          </Step>
        ))}
      </Stepper>
    </Box>
  );
}

/** "Start over", once something is entered: asks first, then a blank wizard at the first step. */
function StartOver() {
  const { step, form, startOver } = useBaselineWizard();
  const weight = useWatch({ control: form.control, name: 'rider.massKg' });
  const [asking, setAsking] = useState(false);
  const [asked, setAsked] = useState(false);
  if (step === 0 && !Number.isFinite(weight)) return null;
  return (
    <>
      <Button
        size="small"
        startIcon={<RestartAltIcon />}
        onClick={() => {
          setAsked(true);
          setAsking(true);
        }}
        sx={{ ml: 'auto', minHeight: 32 }}
      >
        Start over
      </Button>
      {/* mounted from the first ask on, so that closing plays the dialog's exit transition */}
      {asked && (
        <Suspense fallback={null}>
          <StartOverDialog
            open={asking}
            onKeep={() => setAsking(false)}
            onStartOver={() => {
              setAsking(false);
              const onFirstStep = step === 0;
              startOver();
              // from a later step the Rider step's heading takes the focus; on the Rider step itself this
              // button goes away with the input, so the focus goes to the (now empty) weight field
              if (onFirstStep) window.setTimeout(() => form.setFocus('rider.massKg'), 50);
            }}
          />
        </Suspense>
      )}
    </>
  );
}

/**
 * When the rider moves to another step, its heading takes the focus (a screen reader reads the new
 * step, Tab goes on from there). A step whose heading comes later (the Baseline step while it is
 * worked out) holds the focus itself until the heading is there.
 */
function useStepHeadingFocus(container: RefObject<HTMLElement | null>, step: number) {
  const { takeHeadingFocus } = useBaselineWizard();
  useEffect(() => {
    const box = container.current;
    if (!takeHeadingFocus() || !box) return;
    const heading = () =>
      Array.from(box.querySelectorAll<HTMLElement>('h1, h2')).find((h) => !h.closest('.print-only'));
    const focus = (h: HTMLElement) => {
      if (!h.hasAttribute('tabindex')) h.setAttribute('tabindex', '-1');
      h.focus({ preventScroll: true });
    };
    let observer: MutationObserver | undefined;
    // after this commit and the history entry's update have settled
    const timer = window.setTimeout(() => {
      const now = heading();
      if (now) {
        focus(now);
        return;
      }
      box.focus({ preventScroll: true });
      observer = new MutationObserver(() => {
        const later = heading();
        if (!later) return;
        observer?.disconnect();
        const active = document.activeElement;
        if (!active || active === box || active === document.body) focus(later);
      });
      observer.observe(box, { childList: true, subtree: true });
    }, 0);
    return () => {
      window.clearTimeout(timer);
      observer?.disconnect();
    };
  }, [container, step, takeHeadingFocus]);
}

const INPUT_STEPS: readonly string[] = ['rider', 'riding', 'bike'];
const TEXT_INPUTS: readonly string[] = ['text', 'number', 'search', 'tel', 'url', 'email'];

/** The step's name in the tab's title, so the history list and a screen reader's page title say it. */
function useStepTitle(label: string) {
  useEffect(() => {
    const before = document.title;
    document.title = `${label} · Baseline · Loamline`;
    return () => {
      document.title = before;
    };
  }, [label]);
}

/** On the Baseline or Sag check step when what the form holds is no longer what the baseline was for. */
function InputChanged() {
  const { goTo } = useBaselineWizard();
  return (
    <Alert severity="info" variant="outlined">
      <AlertTitle>What you entered has changed</AlertTitle>
      The baseline shown before was for other input. Check the Bike step and get your baseline again.
      <Box sx={{ mt: 1.5 }}>
        <Button variant="contained" onClick={() => goTo('bike')}>
          Back to the Bike step
        </Button>
      </Box>
    </Alert>
  );
}

/** Back and Next, large, at the bottom of the screen where the thumb is. */
function StepNav() {
  const { step, stepId, next, back, result, computing } = useBaselineWizard();
  const nextLabel = stepId === 'bike' ? 'Get my baseline' : stepId === 'baseline' ? 'Check my sag' : 'Next';
  const last = stepId === 'sag-check';
  return (
    <Box
      className="no-print wizard-nav"
      sx={{
        position: 'sticky',
        bottom: 0,
        zIndex: 2,
        py: 1.5,
        px: { xs: 2, sm: 0 },
        mx: { xs: -2, sm: 0 },
        bgcolor: 'rgba(247,245,240,0.96)',
        boxShadow: { xs: '0 -1px 0 rgba(30,36,33,0.12)', sm: 'none' },
        backdropFilter: 'blur(4px)',
      }}
    >
      <Stack direction="row" spacing={1.5}>
        {step > 0 && (
          <Button
            variant="outlined"
            size="large"
            onClick={back}
            startIcon={<ArrowBackIcon />}
            sx={{ flex: 1, minHeight: 52, bgcolor: 'background.paper' }}
          >
            Back
          </Button>
        )}
        {!last && (
          <Button
            variant="contained"
            size="large"
            onClick={() => void next()}
            endIcon={<ArrowForwardIcon />}
            disabled={stepId === 'baseline' && (!result || computing)}
            sx={{ flex: step > 0 ? 2 : 1, minHeight: 52 }}
          >
            {nextLabel}
          </Button>
        )}
      </Stack>
    </Box>
  );
}

export interface BaselineWizardProps extends BaselineStepProps {
  /** shown at the top of the Bike step, e.g. "From my garage" */
  bikePicker?: ReactNode;
}

/**
 * The rider's baseline, phone first: Rider · Riding · Bike · Baseline · Sag check. Wrap it in
 * <BaselineWizardProvider>; `sheetActions` puts more buttons beside Print on the Baseline step.
 */
export function BaselineWizard({ sheetActions, bikePicker }: BaselineWizardProps) {
  const { step, stepId, units, setUnits, next, request } = useBaselineWizard();
  const wide = stepId === 'baseline';
  const stepBox = useRef<HTMLDivElement>(null);
  useStepHeadingFocus(stepBox, step);
  useStepTitle(STEPS[step].label);
  const changed = (stepId === 'baseline' || stepId === 'sag-check') && !request;

  // Enter in a field of an input step does what Next does (a form's submit, without nesting forms)
  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const t = e.target;
    if (e.key !== 'Enter' || e.defaultPrevented || e.nativeEvent.isComposing) return;
    if (!INPUT_STEPS.includes(stepId) || !(t instanceof HTMLInputElement)) return;
    // a dialog or menu portalled out of the step is not the step's field
    if (!e.currentTarget.contains(t) || !TEXT_INPUTS.includes(t.type)) return;
    e.preventDefault();
    void next();
  };
  return (
    <Container
      maxWidth={wide ? 'lg' : 'sm'}
      sx={{
        pt: { xs: 2, sm: 4 },
        px: { xs: 2, sm: 3 },
        // the wizard fills the screen below the app bar, so Back and Next sit at the bottom, near the thumb
        display: 'flex',
        flexDirection: 'column',
        minHeight: { xs: 'calc(100dvh - 56px)', sm: 'calc(100dvh - 64px)' },
      }}
    >
      <BaselinePrintStyles />
      <Stack
        direction="row"
        className="no-print"
        sx={{ alignItems: 'center', justifyContent: 'space-between', gap: 1, mb: 1.5 }}
      >
        <Typography variant="h1" sx={{ fontSize: { xs: '1.15rem', sm: '1.4rem' }, color: pine[700] }}>
          Baseline
        </Typography>
        <UnitsControl units={units} onChange={setUnits} />
      </Stack>
      <StepHeader />
      <Box
        ref={stepBox}
        tabIndex={-1}
        onKeyDown={onKeyDown}
        sx={{ mt: 3, mb: 4, flex: '1 0 auto', '&:focus': { outline: 'none' } }}
      >
        {stepId === 'rider' && <RiderStep />}
        {stepId === 'riding' && <RidingStep />}
        {stepId === 'bike' && <BikeStep picker={bikePicker} />}
        {changed && <InputChanged />}
        {stepId === 'baseline' && !changed && <BaselineStep sheetActions={sheetActions} />}
        {stepId === 'sag-check' && !changed && <SagCheckStep sheetActions={sheetActions} />}
      </Box>
      <StepNav />
    </Container>
  );
}
