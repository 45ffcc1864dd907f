import AddIcon from '@mui/icons-material/Add';
import DeleteOutlineIcon from '@mui/icons-material/DeleteOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import IconButton from '@mui/material/IconButton';
import InputAdornment from '@mui/material/InputAdornment';
import Stack from '@mui/material/Stack';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import type { ServiceReport } from '@loamline/shared-types';
import { useEffect, useRef, useState } from 'react';
import { Controller, useFieldArray, useForm, type UseFormReturn } from 'react-hook-form';
import { TextInput } from '@/components/ui/text-input';
import { ApiRequestError } from '@/lib/api-client';
import type { UnitPrefs } from '@/lib/units';
import { saveReport } from '../api/workshop-report';
import { partName, PARTS, type Part } from '../types';
import {
  checkValue,
  convertPart,
  fieldUnit,
  formFieldOf,
  formValues,
  reportInput,
  type FieldName,
  type ReportFormValues,
} from '../utils/report-form';
import { savedAtLabel } from '../utils/time';

const LABELS: Record<FieldName, string> = {
  mainPsi: 'Main chamber',
  endStrokePsi: 'End-stroke chamber',
  spacers: 'Volume spacers',
  springRateLbPerIn: 'Spring rate',
  reboundClicks: 'Rebound, clicks from closed',
  compressionClicks: 'Compression, clicks from closed',
  sagMm: 'Sag measured',
};
const HELP: Partial<Record<FieldName, string>> = {
  endStrokePsi: 'Blank when the fork has none',
  reboundClicks: 'Counted out from fully closed (clockwise in)',
  compressionClicks: 'Counted out from fully closed (clockwise in)',
};

function SettingField({
  form,
  part,
  field,
  prefs,
  disabled,
}: {
  form: UseFormReturn<ReportFormValues>;
  part: Part;
  field: FieldName;
  prefs: UnitPrefs;
  disabled: boolean;
}) {
  const unit = fieldUnit(field, prefs);
  const label = LABELS[field];
  return (
    <Controller
      control={form.control}
      name={`${part}.${field}`}
      rules={{ validate: (v) => checkValue(field, String(v ?? ''), prefs) ?? true }}
      render={({ field: f, fieldState }) => (
        <TextInput
          {...f}
          value={f.value ?? ''}
          label={label}
          size="small"
          disabled={disabled}
          error={!!fieldState.error}
          helperText={fieldState.error?.message ?? HELP[field] ?? ' '}
          slotProps={{
            htmlInput: {
              inputMode: 'decimal',
              'aria-label': `${partName(part)}: ${label}${unit ? ` (${unit})` : ''}`,
            },
            input: unit
              ? { endAdornment: <InputAdornment position="end">{unit}</InputAdornment> }
              : undefined,
          }}
        />
      )}
    />
  );
}

function PartFields({
  form,
  part,
  prefs,
  disabled,
}: {
  form: UseFormReturn<ReportFormValues>;
  part: Part;
  prefs: UnitPrefs;
  disabled: boolean;
}) {
  const spring = form.watch(`${part}.spring`);
  const fields: FieldName[] =
    spring === 'coil'
      ? ['springRateLbPerIn', 'sagMm', 'reboundClicks', 'compressionClicks']
      : part === 'fork'
        ? ['mainPsi', 'endStrokePsi', 'spacers', 'sagMm', 'reboundClicks', 'compressionClicks']
        : ['mainPsi', 'spacers', 'sagMm', 'reboundClicks', 'compressionClicks'];
  const titleId = `report-${part}-title`;
  return (
    <Box component="fieldset" aria-labelledby={titleId} sx={{ border: 0, p: 0, m: 0, minWidth: 0 }}>
      <Stack direction="row" sx={{ alignItems: 'center', justifyContent: 'space-between', mb: 1, gap: 1 }}>
        <Typography id={titleId} variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
          {partName(part)}
        </Typography>
        <Controller
          control={form.control}
          name={`${part}.spring`}
          render={({ field: f }) => (
            <ToggleButtonGroup
              size="small"
              exclusive
              value={f.value}
              disabled={disabled}
              aria-label={`${partName(part)}: spring`}
              onChange={(_, v: string | null) => v && f.onChange(v)}
            >
              <ToggleButton value="air">Air</ToggleButton>
              <ToggleButton value="coil">Coil</ToggleButton>
            </ToggleButtonGroup>
          )}
        />
      </Stack>
      <Box
        sx={{
          display: 'grid',
          gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr' },
          columnGap: 1.5,
          rowGap: 0.5,
        }}
      >
        {fields.map((f) => (
          <SettingField key={f} form={form} part={part} field={f} prefs={prefs} disabled={disabled} />
        ))}
      </Box>
    </Box>
  );
}

function Checklist({ form, disabled }: { form: UseFormReturn<ReportFormValues>; disabled: boolean }) {
  const { fields, append, remove } = useFieldArray({ control: form.control, name: 'checklist' });
  const [item, setItem] = useState('');
  const add = () => {
    const label = item.trim();
    if (!label) return;
    append({ label, done: true });
    setItem('');
  };
  return (
    <Box component="fieldset" sx={{ border: 0, p: 0, m: 0, minWidth: 0 }}>
      <Typography component="legend" variant="subtitle1" sx={{ fontWeight: 700, mb: 0.5 }}>
        Work done
      </Typography>
      {fields.length === 0 && (
        <Typography variant="body2" color="text.secondary">
          The service has no checklist; add what was done.
        </Typography>
      )}
      <Box component="ul" sx={{ listStyle: 'none', p: 0, m: 0 }}>
        {fields.map((f, i) => (
          <Box component="li" key={f.id} sx={{ display: 'flex', alignItems: 'center' }}>
            <Controller
              control={form.control}
              name={`checklist.${i}.done`}
              render={({ field }) => (
                <FormControlLabel
                  sx={{ flexGrow: 1, mr: 0 }}
                  disabled={disabled}
                  control={
                    <Checkbox
                      checked={!!field.value}
                      onChange={(e) => field.onChange(e.target.checked)}
                      onBlur={field.onBlur}
                    />
                  }
                  label={f.label}
                />
              )}
            />
            {!disabled && (
              <IconButton aria-label={`Remove “${f.label}”`} onClick={() => remove(i)} size="small">
                <DeleteOutlineIcon fontSize="small" />
              </IconButton>
            )}
          </Box>
        ))}
      </Box>
      {!disabled && (
        <Stack direction="row" spacing={1} sx={{ mt: 1, alignItems: 'flex-start' }}>
          <TextInput
            size="small"
            label="Add an item"
            value={item}
            onChange={(e) => setItem(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === 'Enter') {
                e.preventDefault();
                add();
              }
            }}
            slotProps={{ htmlInput: { maxLength: 200 } }}
            sx={{ flexGrow: 1 }}
          />
          <Button variant="outlined" startIcon={<AddIcon />} onClick={add} disabled={!item.trim()}>
            Add
          </Button>
        </Stack>
      )}
    </Box>
  );
}

/**
 * The report's form: work done, notes, the settings each part was left with. Saved as a draft by
 * Save (nothing is saved on its own); the state line says "Saved at …" or "Unsaved changes". A 409
 * means another save won (or the report became final): the technician reloads, losing their edits.
 */
export function ReportForm({
  appointmentId,
  report,
  prefs,
  zone,
  onReload,
}: {
  appointmentId: string;
  report: ServiceReport;
  prefs: UnitPrefs;
  zone: string;
  onReload: () => Promise<ServiceReport | undefined>;
}) {
  const final = report.status === 'final';
  const form = useForm<ReportFormValues>({ defaultValues: formValues(report, prefs), mode: 'onTouched' });
  const { isDirty, isSubmitting } = form.formState;
  const [conflict, setConflict] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  // this page's last save (the report prop follows once the cache has it)
  const [saved, setSaved] = useState<Pick<ServiceReport, 'updatedAt' | 'updatedBy'> | null>(null);
  const time = (iso: string | null) => (iso ? Date.parse(iso) : 0);
  const last = saved && time(saved.updatedAt) >= time(report.updatedAt) ? saved : report;

  // the units changed: the same values, shown in the new units (still unsaved if they were)
  const shownIn = useRef(prefs);
  useEffect(() => {
    const from = shownIn.current;
    if (from === prefs) return;
    shownIn.current = prefs;
    const dirty = form.formState.isDirty;
    const v = form.getValues();
    const converted = {
      ...v,
      fork: convertPart(v.fork, from, prefs),
      shock: convertPart(v.shock, from, prefs),
    };
    form.reset(formValues(report, prefs));
    if (dirty) form.reset(converted, { keepDefaultValues: true });
  }, [prefs, form, report]);

  // someone else's save arrived (a reload) while nothing here is unsaved: show it
  const seen = useRef(report.updatedAt);
  // the version the edits started from: the server refuses a save over a newer one (409)
  const version = useRef(report.version);
  useEffect(() => {
    if (seen.current === report.updatedAt) return;
    seen.current = report.updatedAt;
    if (!form.formState.isDirty) {
      version.current = report.version;
      form.reset(formValues(report, prefs));
    }
  }, [report, prefs, form]);

  const submit = form.handleSubmit(async (values) => {
    setError(null);
    setConflict(null);
    try {
      const saved = await saveReport(appointmentId, reportInput(values, prefs, version.current));
      seen.current = saved.updatedAt;
      version.current = saved.version;
      setSaved({ updatedAt: saved.updatedAt, updatedBy: saved.updatedBy });
      form.reset(formValues(saved, prefs));
    } catch (e) {
      if (e instanceof ApiRequestError && e.status === 409) {
        setConflict(e.body.message);
        return;
      }
      if (e instanceof ApiRequestError && e.body.fields) {
        for (const [path, msg] of Object.entries(e.body.fields)) {
          const name = formFieldOf(path);
          if (name) form.setError(name, { message: msg });
        }
      }
      setError(e instanceof ApiRequestError ? e.body.message : 'The report was not saved.');
    }
  });

  // after a 409: the server's report replaces the edits that lost
  const reload = async () => {
    const fresh = await onReload();
    if (fresh) {
      seen.current = fresh.updatedAt;
      version.current = fresh.version;
      setSaved({ updatedAt: fresh.updatedAt, updatedBy: fresh.updatedBy });
      form.reset(formValues(fresh, prefs));
    }
    setConflict(null);
  };

  return (
    <Box component="form" noValidate onSubmit={(e) => void submit(e)} aria-label="Service report">
      <fieldset disabled={final} style={{ border: 0, padding: 0, margin: 0, minWidth: 0 }}>
        <Stack spacing={2.5}>
          <Checklist form={form} disabled={final} />
          <Controller
            control={form.control}
            name="notes"
            render={({ field }) => (
              <TextInput
                {...field}
                label="Notes for the rider"
                multiline
                minRows={3}
                disabled={final}
                slotProps={{ htmlInput: { maxLength: 4000 } }}
                helperText="What you found and did, in words the rider reads."
              />
            )}
          />
          <Box>
            <Typography variant="subtitle1" component="h3" sx={{ fontWeight: 700 }}>
              Final settings
            </Typography>
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
              What each part was left with. Leave a part blank if the bike doesn’t have it or you didn’t touch
              it.
            </Typography>
            <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', lg: '1fr 1fr' }, gap: 3 }}>
              {PARTS.map((p) => (
                <PartFields key={p} form={form} part={p} prefs={prefs} disabled={final} />
              ))}
            </Box>
          </Box>
        </Stack>
      </fieldset>
      {conflict !== null && (
        <Alert
          severity="warning"
          role="alert"
          sx={{ mt: 2 }}
          action={
            <Button color="inherit" onClick={() => void reload()}>
              Reload the report
            </Button>
          }
        >
          Someone else saved this report first, or it was completed: your changes are not saved.
          {conflict ? ` (${conflict})` : ''} Reload to see theirs; what you typed here is then lost.
        </Alert>
      )}
      {error && (
        <Alert severity="error" role="alert" sx={{ mt: 2 }}>
          {error}
        </Alert>
      )}
      {!final && (
        <Stack direction="row" spacing={2} sx={{ mt: 2, alignItems: 'center', flexWrap: 'wrap' }}>
          <Button type="submit" variant="contained" disabled={isSubmitting}>
            {isSubmitting ? 'Saving…' : 'Save draft'}
          </Button>
          <Typography variant="body2" role="status" data-testid="report-save-state" color="text.secondary">
            {isDirty
              ? 'Unsaved changes'
              : last.updatedAt
                ? `Saved at ${savedAtLabel(last.updatedAt, zone)}${last.updatedBy ? ` by ${last.updatedBy}` : ''}`
                : 'Not saved yet'}
          </Typography>
        </Stack>
      )}
    </Box>
  );
}
