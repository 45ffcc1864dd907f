import type { Assumption } from '@loamline/shared-types';
import ExpandMoreIcon from '@mui/icons-material/ExpandMore';
import Accordion from '@mui/material/Accordion';
import AccordionDetails from '@mui/material/AccordionDetails';
import AccordionSummary from '@mui/material/AccordionSummary';
import Box from '@mui/material/Box';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { useWatch } from 'react-hook-form';
import type { UnitPrefs } from '@/lib/units';
import {
  FORK_GEOMETRY_KEYS,
  SHOCK_GEOMETRY_KEYS,
  type BaselineField,
  type BaselineFormValues,
  type GeometryKey,
} from '../form';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { formatShown, type NumberDisplay } from '../utils/number-display';
import { NumberField } from './form-fields';
import { riderText } from './plain-text';

export const GEOMETRY_LABELS: Record<GeometryKey, string> = {
  pistonDiameterMm: 'Air piston diameter',
  shaftDiameterMm: 'Shaft diameter (negative side)',
  positiveLengthMm: 'Positive air column, fully extended',
  negativeVolumeCm3: 'Negative chamber volume',
  spacerVolumeCm3: 'Volume of one spacer',
  endStrokeVolumeCm3: 'End-stroke chamber volume',
  polytropicIndex: 'Air heating on a hard hit (1.0–1.4)',
};

export function geometryDisplay(key: GeometryKey, units: UnitPrefs): NumberDisplay {
  if (key.endsWith('Mm')) return { quantity: 'length', prefs: units };
  if (key.endsWith('Cm3')) return { quantity: 'volume', prefs: units };
  return { unit: '', decimals: 2 };
}

/** The value the last result assumed for a form field, in the API's unit (front share as a fraction). */
export function assumedValue(
  assumptions: readonly Assumption[] | undefined,
  key: string,
): number | undefined {
  const a = assumptions?.find((x) => x.key === key);
  if (!a || typeof a.value !== 'number') return undefined;
  if ((key === 'rider.frontShare' || key === 'rider.seatedRearShare') && a.value > 1) return a.value / 100; // given in percent
  return a.value;
}

function assumedText(
  assumption: Assumption | undefined,
  value: number | undefined,
  display: NumberDisplay,
  blankText = "Blank: Loamline's default",
) {
  if (!assumption) return blankText;
  const shown =
    value !== undefined
      ? formatShown(value, display)
      : `${String(assumption.value)} ${assumption.unit ?? ''}`;
  return `Blank: ${shown.trim()}, as last time · ${riderText(assumption.source)}`;
}

function Field({
  name,
  label,
  display,
  assumptions,
  assumptionKey = name,
  hint,
  blankText,
}: {
  name: BaselineField;
  label: string;
  display: NumberDisplay;
  assumptions: readonly Assumption[] | undefined;
  /** where the last result's assumption for this field is listed, when not under the field's name */
  assumptionKey?: string;
  /** a plain line before what a blank means */
  hint?: string;
  /** what a blank means before there is a result to say it */
  blankText?: string;
}) {
  const { form } = useBaselineWizard();
  const assumed = assumedValue(assumptions, assumptionKey);
  const blank = assumedText(
    assumptions?.find((a) => a.key === assumptionKey),
    assumed,
    display,
    blankText,
  );
  return (
    <NumberField
      control={form.control}
      name={name}
      label={label}
      display={display}
      placeholderValue={assumed}
      helperText={hint ? `${hint} ${blank}` : blank}
    />
  );
}

function Group({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Stack spacing={2} component="fieldset" sx={{ border: 0, p: 0, m: 0 }}>
      <Typography component="legend" variant="subtitle1" sx={{ fontWeight: 700, mb: 1 }}>
        {title}
      </Typography>
      {children}
    </Stack>
  );
}

/**
 * The numbers behind the baseline, collapsed by default: the geometry each air spring uses, target
 * sag, front share, altitude and temperature. Blank means Loamline's labelled default (shown from
 * the last result); a value typed here is sent as an override.
 */
export function AdvancedPanel() {
  const { form, units, result, advancedOpen, setAdvancedOpen } = useBaselineWizard();
  const [fork, shock] = useWatch<BaselineFormValues, ['fork', 'shock']>({
    control: form.control,
    name: ['fork', 'shock'],
  });
  const assumptions = result?.assumptions;
  const forkAir = fork.present && fork.spring === 'air';
  const shockAir = shock.present && shock.spring === 'air';
  return (
    <Accordion
      expanded={advancedOpen}
      onChange={(_e, open) => setAdvancedOpen(open)}
      disableGutters
      sx={{ borderRadius: '10px !important', '&:before': { display: 'none' } }}
      variant="outlined"
      slotProps={{ transition: { unmountOnExit: true } }}
    >
      <AccordionSummary expandIcon={<ExpandMoreIcon />} aria-controls="advanced-content" id="advanced-header">
        <Box>
          <Typography sx={{ fontWeight: 500 }}>Advanced: geometry and conditions</Typography>
          <Typography variant="body2" color="text.secondary">
            Where you pump and ride, weight split, target sag, leverage ratio, the spring sizes Loamline
            assumes
          </Typography>
        </Box>
      </AccordionSummary>
      <AccordionDetails id="advanced-content">
        <Stack spacing={4}>
          <Typography variant="body2" color="text.secondary">
            Leave a field blank to use Loamline&apos;s default. Defaults for the air spring are estimates from
            the stanchion size and the stroke; a technician can measure the real ones.
            {!result && ' The values assumed appear here once you have a baseline.'}
          </Typography>
          <Group title="Where you pump and where you ride">
            <Typography variant="body2" color="text.secondary">
              Air reads differently higher up. Pumped at home at one altitude and riding at another? Put both:
              the pressure to set is for where you pump, and the baseline says what the gauge reads where you
              ride.
            </Typography>
            <Field
              name="conditions.pumpAltitudeM"
              label="Altitude where you pump and measure sag"
              display={{ quantity: 'altitude', prefs: units }}
              assumptions={assumptions}
              blankText="Blank: the same as where you ride."
            />
            <Field
              name="conditions.altitudeM"
              label="Altitude where you ride"
              display={{ quantity: 'altitude', prefs: units }}
              assumptions={assumptions}
            />
            <Field
              name="conditions.temperatureC"
              label="Air temperature where you pump and ride"
              display={{ quantity: 'temperature', prefs: units }}
              assumptions={assumptions}
            />
          </Group>
          <Group title="Your weight on the bike">
            <Field
              name="rider.frontShare"
              label="Share of your weight on the front wheel, standing"
              display={{ percentOfFraction: true }}
              assumptions={assumptions}
              hint="Fork sag is measured standing in your riding position."
            />
            {shock.present && (
              <Field
                name="rider.seatedRearShare"
                label="Share of your weight on the rear wheel, seated"
                display={{ percentOfFraction: true }}
                assumptions={assumptions}
                hint="Rear sag is measured sitting on the saddle."
              />
            )}
          </Group>
          {fork.present && (
            <Group title="Fork">
              <Field
                name="fork.targetSagPct"
                label="Target sag"
                display={{ unit: '%', decimals: 1 }}
                assumptions={assumptions}
              />
              {forkAir &&
                FORK_GEOMETRY_KEYS.map((k) => (
                  <Field
                    key={k}
                    name={`fork.geometry.${k}`}
                    label={GEOMETRY_LABELS[k]}
                    display={geometryDisplay(k, units)}
                    assumptions={assumptions}
                  />
                ))}
            </Group>
          )}
          {shock.present && (
            <Group title="Rear shock">
              <Field
                name="shock.targetSagPct"
                label="Target sag"
                display={{ unit: '%', decimals: 1 }}
                assumptions={assumptions}
              />
              <Field
                name="shock.leverageRatioAtSag"
                label="Leverage ratio at sag"
                display={{ unit: '', decimals: 2 }}
                assumptions={assumptions}
                hint="From the bike's leverage curve, if you know it (wheel movement ÷ shock movement at sag)."
              />
              {shockAir &&
                SHOCK_GEOMETRY_KEYS.map((k) => (
                  <Field
                    key={k}
                    name={`shock.geometry.${k}`}
                    label={GEOMETRY_LABELS[k]}
                    display={geometryDisplay(k, units)}
                    assumptions={assumptions}
                  />
                ))}
            </Group>
          )}
        </Stack>
      </AccordionDetails>
    </Accordion>
  );
}
