import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import ArrowForwardIcon from '@mui/icons-material/ArrowForward';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Stack from '@mui/material/Stack';
import Step from '@mui/material/Step';
import StepButton from '@mui/material/StepButton';
import Stepper from '@mui/material/Stepper';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { STEPS } from '../form';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { BaselineStep, type BaselineStepProps } from './baseline-step';
import { BikeStep } from './bike-step';
import { BaselinePrintStyles } from './print-styles';
import { RiderStep } from './rider-step';
import { RidingStep } from './riding-step';
import { SagCheckStep } from './sag-check-step';
import { UnitsControl } from './units-control';
import { ochre, pine } from '@/theme/primitives';

/** "Step 2 of 5 · Riding" and a bar of five segments: readable on a phone. */
function StepHeader() {
  const { step, goTo, result } = useBaselineWizard();
  const current = STEPS[step];
  return (
    <Box className="no-print">
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
      <Box sx={{ display: { xs: 'flex', sm: 'none' }, gap: 0.75, mt: 1 }} aria-hidden>
        {STEPS.map((s, i) => (
          <Box
            key={s.id}
            sx={{
              flex: 1,
              height: 6,
              borderRadius: 3,
              bgcolor: i < step ? pine[300] : i === step ? pine[500] : 'divider',
            }}
          />
        ))}
      </Box>
      <Stepper
        nonLinear
        activeStep={step}
        sx={{ display: { xs: 'none', sm: 'flex' }, '& .MuiStepIcon-root.Mui-active': { color: ochre[500] } }}
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
  const { stepId, units, setUnits } = useBaselineWizard();
  const wide = stepId === 'baseline';
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
      <Box sx={{ mt: 3, mb: 4, flex: '1 0 auto' }}>
        {stepId === 'rider' && <RiderStep />}
        {stepId === 'riding' && <RidingStep />}
        {stepId === 'bike' && <BikeStep picker={bikePicker} />}
        {stepId === 'baseline' && <BaselineStep sheetActions={sheetActions} />}
        {stepId === 'sag-check' && <SagCheckStep sheetActions={sheetActions} />}
      </Box>
      <StepNav />
    </Container>
  );
}
