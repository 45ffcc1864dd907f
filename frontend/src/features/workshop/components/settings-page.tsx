import { zodResolver } from '@hookform/resolvers/zod';
import AddIcon from '@mui/icons-material/Add';
import DeleteOutlinedIcon from '@mui/icons-material/DeleteOutlined';
import Alert from '@mui/material/Alert';
import Autocomplete from '@mui/material/Autocomplete';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import IconButton from '@mui/material/IconButton';
import InputAdornment from '@mui/material/InputAdornment';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ShopSettings } from '@loamline/shared-types';
import { useState, type ReactNode } from 'react';
import { Controller, useFieldArray, useForm, type Control, type FieldPath } from 'react-hook-form';
import { FormTextField } from '@/components/form/form-text-field';
import { TextInput } from '@/components/ui/text-input';
import { LoadError } from '@/components/ui/load-error';
import { useSession } from '@/features/auth/api/get-me';
import { sentence } from '@/features/auth/utils/server-errors';
import { ApiRequestError } from '@/lib/api-client';
import { saveShopSettings, useShopSettings } from '../api/settings';
import {
  formPathOfField,
  formToSettings,
  settingsFormSchema,
  settingsToForm,
  type SettingsFormValues,
} from '../utils/settings-form';
import { WEEKDAYS } from '../utils/time';
import { CalendarFeedCard } from './calendar-feed-card';
import { WorkshopShell } from './workshop-shell';

const TIME_ZONES: string[] = (() => {
  try {
    return Intl.supportedValuesOf('timeZone');
  } catch {
    return [];
  }
})();
const CURRENCIES: string[] = (() => {
  try {
    return Intl.supportedValuesOf('currency');
  } catch {
    return ['EUR', 'USD', 'GBP', 'CHF'];
  }
})();

type Ctl = Control<SettingsFormValues>;

function Panel({
  title,
  id,
  hint,
  children,
}: {
  title: string;
  id: string;
  hint?: string;
  children: ReactNode;
}) {
  return (
    <Card component="section" aria-labelledby={id}>
      <CardContent>
        <Typography id={id} variant="h3" component="h2" sx={{ fontSize: '1.1rem', mb: hint ? 0.5 : 1.5 }}>
          {title}
        </Typography>
        {hint && (
          <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
            {hint}
          </Typography>
        )}
        {children}
      </CardContent>
    </Card>
  );
}

/** A select-with-typing of a list of codes, wired to the form. */
function CodeField({
  control,
  name,
  label,
  options,
  disabled,
  helperText,
}: {
  control: Ctl;
  name: 'timeZone' | 'currency';
  label: string;
  options: string[];
  disabled: boolean;
  helperText?: string;
}) {
  return (
    <Controller
      name={name}
      control={control}
      render={({ field, fieldState }) => (
        <Autocomplete
          options={options.includes(field.value) || !field.value ? options : [field.value, ...options]}
          value={field.value || null}
          onChange={(_e, v) => field.onChange(v ?? '')}
          onBlur={field.onBlur}
          disabled={disabled}
          size="small"
          autoHighlight
          getOptionLabel={(o) => (name === 'timeZone' ? o.replace(/_/g, ' ') : o)}
          renderInput={(params) => (
            <TextInput
              {...params}
              label={label}
              name={field.name}
              inputRef={field.ref}
              error={!!fieldState.error}
              helperText={fieldState.error?.message ?? helperText}
            />
          )}
          sx={{ minWidth: name === 'timeZone' ? 280 : 140 }}
        />
      )}
    />
  );
}

function DayRow({ control, dayIndex, disabled }: { control: Ctl; dayIndex: number; disabled: boolean }) {
  const { fields, append, remove } = useFieldArray({ control, name: `days.${dayIndex}.intervals` });
  const day = WEEKDAYS[dayIndex];
  return (
    <Stack
      direction={{ xs: 'column', sm: 'row' }}
      spacing={1}
      sx={{ py: 1, borderTop: dayIndex ? 1 : 0, borderColor: 'divider', alignItems: { sm: 'flex-start' } }}
      role="group"
      aria-label={day}
    >
      <Typography sx={{ width: 110, flexShrink: 0, fontWeight: 500, pt: { sm: 1 } }}>{day}</Typography>
      <Stack direction="row" sx={{ flexGrow: 1, flexWrap: 'wrap', columnGap: 3, rowGap: 1 }}>
        {fields.length === 0 && (
          <Typography variant="body2" color="text.secondary" sx={{ pt: { sm: 1 } }}>
            Closed
          </Typography>
        )}
        {fields.map((f, k) => (
          <Stack key={f.id} direction="row" spacing={0.75} sx={{ alignItems: 'flex-start' }}>
            <FormTextField
              control={control}
              name={`days.${dayIndex}.intervals.${k}.start` as FieldPath<SettingsFormValues>}
              label="Opens"
              size="small"
              placeholder="09:00"
              disabled={disabled}
              sx={{ width: 112 }}
              slotProps={{
                htmlInput: { 'aria-label': `${day}, interval ${k + 1}, opens`, inputMode: 'numeric' },
              }}
            />
            <FormTextField
              control={control}
              name={`days.${dayIndex}.intervals.${k}.end` as FieldPath<SettingsFormValues>}
              label="Closes"
              size="small"
              placeholder="17:30"
              disabled={disabled}
              sx={{ width: 112 }}
              slotProps={{
                htmlInput: { 'aria-label': `${day}, interval ${k + 1}, closes`, inputMode: 'numeric' },
              }}
            />
            {!disabled && (
              <IconButton
                aria-label={`Remove ${day} interval ${k + 1}`}
                onClick={() => remove(k)}
                sx={{ mt: 0.25 }}
              >
                <DeleteOutlinedIcon fontSize="small" />
              </IconButton>
            )}
          </Stack>
        ))}
      </Stack>
      {!disabled && (
        <Button
          size="small"
          startIcon={<AddIcon />}
          onClick={() => {
            const last = fields[fields.length - 1];
            append(last ? { start: last.end, end: '' } : { start: '09:00', end: '17:00' });
          }}
          aria-label={`Add opening hours on ${day}`}
          sx={{ alignSelf: { sm: 'flex-start' }, mt: { sm: 0.5 }, whiteSpace: 'nowrap' }}
        >
          Add hours
        </Button>
      )}
    </Stack>
  );
}

function ClosuresPanel({ control, disabled }: { control: Ctl; disabled: boolean }) {
  const { fields, append, remove } = useFieldArray({ control, name: 'closures' });
  return (
    <Panel
      title="Closures"
      id="closures-title"
      hint="Days the shop is shut: one day, or a range (leave “Last day” empty for one day)."
    >
      {fields.length === 0 && (
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          No closures.
        </Typography>
      )}
      <Stack spacing={1.25}>
        {fields.map((f, i) => (
          <Stack
            key={f.id}
            direction={{ xs: 'column', md: 'row' }}
            spacing={1}
            role="group"
            aria-label={`Closure ${i + 1}`}
          >
            <FormTextField
              control={control}
              name={`closures.${i}.from`}
              label="First day"
              type="date"
              size="small"
              disabled={disabled}
              slotProps={{ inputLabel: { shrink: true } }}
              sx={{ width: { md: 210 } }}
            />
            <FormTextField
              control={control}
              name={`closures.${i}.to`}
              label="Last day"
              type="date"
              size="small"
              disabled={disabled}
              slotProps={{ inputLabel: { shrink: true } }}
              sx={{ width: { md: 210 } }}
            />
            <FormTextField
              control={control}
              name={`closures.${i}.reason`}
              label="Reason"
              size="small"
              disabled={disabled}
              sx={{ flexGrow: 1 }}
            />
            {!disabled && (
              <IconButton
                aria-label={`Remove closure ${i + 1}`}
                onClick={() => remove(i)}
                sx={{ alignSelf: 'flex-start' }}
              >
                <DeleteOutlinedIcon fontSize="small" />
              </IconButton>
            )}
          </Stack>
        ))}
      </Stack>
      {!disabled && (
        <Button
          startIcon={<AddIcon />}
          sx={{ mt: 1 }}
          onClick={() => append({ from: '', to: '', reason: '' })}
        >
          Add a closure
        </Button>
      )}
    </Panel>
  );
}

function SettingsForm({ settings, owner }: { settings: ShopSettings; owner: boolean }) {
  const [saved, setSaved] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, reset, formState } = useForm<SettingsFormValues>({
    resolver: zodResolver(settingsFormSchema),
    defaultValues: settingsToForm(settings),
    mode: 'onTouched',
  });
  const disabled = !owner;
  const onSubmit = handleSubmit(
    async (values) => {
      setSaved(false);
      setFormError(null);
      const { body, hourPaths } = formToSettings(values);
      try {
        const stored = await saveShopSettings(body);
        reset(settingsToForm(stored));
        setSaved(true);
      } catch (e) {
        if (e instanceof ApiRequestError && e.status === 400 && e.body.fields) {
          let unplaced = false;
          let first = true;
          for (const [f, m] of Object.entries(e.body.fields)) {
            const path = formPathOfField(f, hourPaths, m);
            if (path) {
              setError(
                path as FieldPath<SettingsFormValues>,
                { message: sentence(m) },
                { shouldFocus: first },
              );
              first = false;
            } else unplaced = true;
          }
          setFormError(unplaced ? e.body.message : 'Some values were not accepted; see the marked inputs.');
        } else {
          setFormError(
            e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.',
          );
        }
      }
    },
    () => setFormError('Some values need a look; see the marked inputs.'),
  );
  const minutes = (unit: string) => ({
    input: { endAdornment: <InputAdornment position="end">{unit}</InputAdornment> },
  });
  return (
    <Box component="form" noValidate onSubmit={(e) => void onSubmit(e)}>
      <Stack spacing={2}>
        {!owner && <Alert severity="info">Only the shop owner changes hours and rules.</Alert>}
        <Panel title="Shop" id="shop-title">
          <Stack direction={{ xs: 'column', md: 'row' }} spacing={2}>
            <CodeField
              control={control}
              name="timeZone"
              label="Time zone"
              options={TIME_ZONES}
              disabled={disabled}
              helperText="Opening hours and appointments are in this zone."
            />
            <CodeField
              control={control}
              name="currency"
              label="Currency"
              options={CURRENCIES}
              disabled={disabled}
            />
            <FormTextField
              control={control}
              name="benches"
              label="Benches"
              size="small"
              inputMode="numeric"
              disabled={disabled}
              helperText="Appointments at the same time."
              sx={{ width: { md: 220 } }}
            />
          </Stack>
        </Panel>
        <Panel
          title="Opening hours"
          id="hours-title"
          hint="Wall-clock times in the shop’s zone; several intervals a day for a lunch break. 24:00 for midnight."
        >
          {[0, 1, 2, 3, 4, 5, 6].map((d) => (
            <DayRow key={d} control={control} dayIndex={d} disabled={disabled} />
          ))}
        </Panel>
        <ClosuresPanel control={control} disabled={disabled} />
        <Panel title="Booking rules" id="rules-title">
          <Box
            sx={{
              display: 'grid',
              gap: 2,
              gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr', md: 'repeat(3, 1fr)' },
            }}
          >
            <FormTextField
              control={control}
              name="rules.slotStepMinutes"
              label="Slot step"
              size="small"
              disabled={disabled}
              slotProps={minutes('min')}
              helperText="Minutes between offered starts."
            />
            <FormTextField
              control={control}
              name="rules.minNoticeMinutes"
              label="Minimum notice"
              size="small"
              disabled={disabled}
              slotProps={minutes('min')}
              helperText="How soon before a start riders can still book."
            />
            <FormTextField
              control={control}
              name="rules.maxDaysAhead"
              label="Days ahead"
              size="small"
              disabled={disabled}
              slotProps={minutes('days')}
              helperText="How far ahead riders can book."
            />
            <FormTextField
              control={control}
              name="rules.holdMinutes"
              label="Hold while paying"
              size="small"
              disabled={disabled}
              slotProps={minutes('min')}
              helperText="An unpaid booking keeps its time this long."
            />
            <FormTextField
              control={control}
              name="rules.cancellationWindowHours"
              label="Cancellation window"
              size="small"
              disabled={disabled}
              slotProps={minutes('h')}
              helperText="Riders who cancel this far ahead get everything back."
            />
          </Box>
        </Panel>
        {formError && <Alert severity="error">{formError}</Alert>}
        {saved && !formState.isDirty && (
          <Alert severity="success">Saved. New bookings follow these hours and rules.</Alert>
        )}
        {owner && (
          <Box sx={{ display: 'flex', gap: 1 }}>
            <Button type="submit" variant="contained" disabled={formState.isSubmitting}>
              {formState.isSubmitting ? 'Saving…' : 'Save hours and rules'}
            </Button>
            <Button
              onClick={() => reset(settingsToForm(settings))}
              disabled={!formState.isDirty || formState.isSubmitting}
            >
              Undo changes
            </Button>
          </Box>
        )}
      </Stack>
    </Box>
  );
}

/** `/workshop/hours`: hours, closures, benches and booking rules (owner edits), the calendar link. */
export function SettingsPage() {
  const { user } = useSession();
  const owner = user?.role === 'owner';
  const { data, error, mutate } = useShopSettings();
  return (
    <WorkshopShell>
      <Typography variant="h3" component="h2" sx={{ mb: 1.5 }}>
        Hours &amp; rules
      </Typography>
      {error && <LoadError what="The shop’s settings" error={error} onRetry={() => void mutate()} />}
      {!data && !error && <Skeleton variant="rounded" height={400} />}
      {data && <SettingsForm settings={data} owner={owner} />}
      {owner && (
        <Box sx={{ mt: 3 }}>
          <CalendarFeedCard />
        </Box>
      )}
    </WorkshopShell>
  );
}
