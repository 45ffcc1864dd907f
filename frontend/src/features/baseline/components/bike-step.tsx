import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Collapse from '@mui/material/Collapse';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { useController, useWatch } from 'react-hook-form';
import type { UnitPrefs } from '@/lib/units';
import { STANCHION_SIZES_MM, type BaselineFormValues } from '../form';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { AdvancedPanel } from './advanced-panel';
import { ChoiceField, CountField, NumberField, type Choice } from './form-fields';
import { formatPsi } from './pressure-text';
import { StepTitle } from './step-title';

type PartKind = 'air' | 'coil' | 'none';

/** Air, coil or none: one choice that sets both `present` and `spring` of a part. */
function PartKindField({ part, noneLabel }: { part: 'fork' | 'shock'; noneLabel: string }) {
  const { form } = useBaselineWizard();
  const present = useController({ control: form.control, name: `${part}.present` });
  const spring = useController({ control: form.control, name: `${part}.spring` });
  const value: PartKind = present.field.value ? spring.field.value : 'none';
  const choices: Choice<PartKind>[] = [
    { value: 'air', label: 'Air' },
    { value: 'coil', label: 'Coil' },
    { value: 'none', label: noneLabel },
  ];
  return (
    <Stack spacing={1}>
      <Typography sx={{ fontWeight: 500 }} id={`${part}-kind`}>
        Spring
      </Typography>
      <Stack direction="row" spacing={1} role="group" aria-labelledby={`${part}-kind`}>
        {choices.map((c) => {
          const on = c.value === value;
          return (
            <Chipish
              key={c.value}
              on={on}
              label={c.label}
              onClick={() => {
                if (c.value === 'none') present.field.onChange(false);
                else {
                  present.field.onChange(true);
                  spring.field.onChange(c.value);
                }
                // "No fork and no shock" is checked on Next; clear a stale message at once
                form.clearErrors('fork.present');
              }}
            />
          );
        })}
      </Stack>
    </Stack>
  );
}

/** A large two- or three-way choice button (aria-pressed says which is on). */
function Chipish({ on, label, onClick }: { on: boolean; label: string; onClick: () => void }) {
  return (
    <Button
      variant={on ? 'contained' : 'outlined'}
      aria-pressed={on}
      onClick={onClick}
      sx={{ flex: 1, minHeight: 48, ...(on ? {} : { bgcolor: 'background.paper' }) }}
    >
      {label}
    </Button>
  );
}

/** "Blank: 150 psi, Loamline's default (an estimate)" from the last result, when it used a default. */
function defaultMaxHint(psi: number | undefined, units: UnitPrefs, what: string): string {
  return psi === undefined
    ? `Blank: Loamline's default for ${what}, an estimate. Use the number printed on it or in its manual.`
    : `Blank: ${formatPsi(psi, units.pressure)}, Loamline's default for ${what} (an estimate). Use the number printed on it or in its manual.`;
}

function ForkCard() {
  const { form, units, result } = useBaselineWizard();
  const mainDefault = result?.fork?.pressure?.maxIsDefault ? result.fork.pressure.maxPsi : undefined;
  const endDefault = result?.fork?.endStroke?.maxIsDefault ? result.fork.endStroke.maxPsi : undefined;
  const fork = useWatch({ control: form.control, name: 'fork' });
  const endStroke = useController({ control: form.control, name: 'fork.hasEndStroke' });
  const air = fork.present && fork.spring === 'air';
  return (
    <Card component="section" aria-labelledby="fork-title">
      <CardContent>
        <Stack spacing={2.5}>
          <Typography variant="h3" id="fork-title">
            Fork
          </Typography>
          <PartKindField part="fork" noneLabel="No fork" />
          <Collapse in={fork.present} unmountOnExit>
            <Stack spacing={2.5}>
              <NumberField
                control={form.control}
                name="fork.travelMm"
                label="Fork travel"
                display={{ quantity: 'length', prefs: units }}
              />
              <ChoiceField<BaselineFormValues, number>
                control={form.control}
                name="fork.stanchionMm"
                label="Stanchion size (the diameter of the upper tubes)"
                layout="wrap"
                choices={STANCHION_SIZES_MM.map((mm) => ({ value: mm, label: `${mm} mm` }))}
              />
              {air && (
                <>
                  <CountField
                    control={form.control}
                    name="fork.spacers"
                    label="Volume spacers fitted"
                    helperText="Plastic inserts in the air chamber; 0 if you don't know."
                  />
                  <Stack spacing={1}>
                    <Typography sx={{ fontWeight: 500 }} id="fork-end-stroke">
                      End-stroke chamber
                    </Typography>
                    <Typography variant="body2" color="text.secondary">
                      A second, separately pumped chamber with its own valve that firms up the last part of
                      travel.
                    </Typography>
                    <Stack direction="row" spacing={1} role="group" aria-labelledby="fork-end-stroke">
                      <Chipish
                        label="No"
                        on={!endStroke.field.value}
                        onClick={() => endStroke.field.onChange(false)}
                      />
                      <Chipish
                        label="Yes, it has one"
                        on={!!endStroke.field.value}
                        onClick={() => endStroke.field.onChange(true)}
                      />
                    </Stack>
                  </Stack>
                  <Collapse in={fork.hasEndStroke} unmountOnExit>
                    {/* room for the outlined label, which sits above the field's box */}
                    <Stack spacing={2.5} sx={{ pt: 1 }}>
                      <NumberField
                        control={form.control}
                        name="fork.endStroke.pressurePsi"
                        label="End-stroke pressure"
                        display={{ quantity: 'pressure', prefs: units }}
                        helperText="Optional: leave empty for a recommended pressure. If you fill it in, it is what you set (or plan to)."
                      />
                      <NumberField
                        control={form.control}
                        name="fork.endStroke.maxPressurePsi"
                        label="End-stroke chamber maximum (optional)"
                        display={{ quantity: 'pressure', prefs: units }}
                        placeholderValue={endDefault}
                        helperText={defaultMaxHint(endDefault, units, 'the end-stroke chamber')}
                      />
                    </Stack>
                  </Collapse>
                  <NumberField
                    control={form.control}
                    name="fork.maxPressurePsi"
                    label="Main chamber maximum (optional)"
                    display={{ quantity: 'pressure', prefs: units }}
                    placeholderValue={mainDefault}
                    helperText={defaultMaxHint(mainDefault, units, "the fork's main chamber")}
                  />
                </>
              )}
            </Stack>
          </Collapse>
        </Stack>
      </CardContent>
    </Card>
  );
}

function ShockCard() {
  const { form, units, result } = useBaselineWizard();
  const shockDefault = result?.shock?.pressure?.maxIsDefault ? result.shock.pressure.maxPsi : undefined;
  const shock = useWatch({ control: form.control, name: 'shock' });
  const air = shock.present && shock.spring === 'air';
  return (
    <Card component="section" aria-labelledby="shock-title">
      <CardContent>
        <Stack spacing={2.5}>
          <Typography variant="h3" id="shock-title">
            Rear shock
          </Typography>
          <PartKindField part="shock" noneLabel="Hardtail" />
          <Collapse in={shock.present} unmountOnExit>
            <Stack spacing={2.5}>
              <NumberField
                control={form.control}
                name="shock.wheelTravelMm"
                label="Rear wheel travel"
                display={{ quantity: 'length', prefs: units }}
              />
              <NumberField
                control={form.control}
                name="shock.strokeMm"
                label="Shock stroke"
                display={{ quantity: 'length', prefs: units }}
                helperText="How far the shaft moves: the second number of the shock's size (e.g. 210 × 55)."
              />
              {air && (
                <>
                  <CountField
                    control={form.control}
                    name="shock.spacers"
                    label="Volume spacers fitted"
                    helperText="0 if you don't know."
                  />
                  <NumberField
                    control={form.control}
                    name="shock.maxPressurePsi"
                    label="Rated maximum pressure (optional)"
                    display={{ quantity: 'pressure', prefs: units }}
                    placeholderValue={shockDefault}
                    helperText={defaultMaxHint(shockDefault, units, 'the shock')}
                  />
                </>
              )}
            </Stack>
          </Collapse>
        </Stack>
      </CardContent>
    </Card>
  );
}

/** `picker`: above the fields, e.g. a bike from the rider's garage. */
export function BikeStep({ picker }: { picker?: ReactNode } = {}) {
  const { form } = useBaselineWizard();
  const noPartError = form.formState.errors.fork?.present?.message;
  return (
    <Stack spacing={3}>
      <StepTitle
        title="Your bike"
        lead="Travel and stanchion size are on the maker's spec sheet for your bike. Leave out a part your bike doesn't have."
      />
      {picker}
      {noPartError && (
        <Alert severity="error" role="alert">
          {noPartError}
        </Alert>
      )}
      <ForkCard />
      <ShockCard />
      <AdvancedPanel />
    </Stack>
  );
}
