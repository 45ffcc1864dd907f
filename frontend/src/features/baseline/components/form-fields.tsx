import AddIcon from '@mui/icons-material/Add';
import RemoveIcon from '@mui/icons-material/Remove';
import Box from '@mui/material/Box';
import FormControl from '@mui/material/FormControl';
import FormHelperText from '@mui/material/FormHelperText';
import FormLabel from '@mui/material/FormLabel';
import IconButton from '@mui/material/IconButton';
import InputAdornment from '@mui/material/InputAdornment';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useEffect, useId, useRef, useState, type ReactNode } from 'react';
import { Controller, useController, type Control, type FieldPath, type FieldValues } from 'react-hook-form';
import { TextInput, type TextInputProps } from '@/components/ui/text-input';
import { parseDecimal } from '@/lib/units';
import { shownFor, textOf, type NumberDisplay } from '../utils/number-display';

/* ------------------------------------------------------------------ numbers with units */

const same = (a: number, b: number): boolean =>
  (Number.isNaN(a) && Number.isNaN(b)) || Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a));

type NumberFieldProps<T extends FieldValues> = Omit<
  TextInputProps,
  'name' | 'value' | 'onChange' | 'defaultValue' | 'type'
> & {
  name: FieldPath<T>;
  control: Control<T>;
  display: NumberDisplay;
  /** a value in the API's unit shown greyed when the field is blank (e.g. the model's default) */
  placeholderValue?: number;
};

/**
 * A number input in the rider's units, wrapped once with react-hook-form's Controller. The form
 * holds the API's unit (kg, psi, mm); the input shows and reads the rider's. What the rider types
 * stays as typed; a change from outside (units switched, form reset) rewrites the text.
 */
export function NumberField<T extends FieldValues>({
  name,
  control,
  display,
  placeholderValue,
  helperText,
  slotProps,
  ...props
}: NumberFieldProps<T>) {
  const { field, fieldState } = useController({ name, control });
  const shown = shownFor(display);
  const value = field.value as number;
  const [text, setText] = useState(() => textOf(value, shown));
  const shownKey = `${shown.unit}:${shown.decimals}`;
  const lastKey = useRef(shownKey);

  useEffect(() => {
    const unitChanged = lastKey.current !== shownKey;
    lastKey.current = shownKey;
    if (unitChanged || !same(shown.fromShown(parseDecimal(text)), value)) setText(textOf(value, shown));
    // `text` is left out on purpose: typing must not be rewritten while it means the stored value
    // (`shown` is keyed by `shownKey`).
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value, shownKey]);

  const placeholder =
    placeholderValue !== undefined && Number.isFinite(placeholderValue)
      ? textOf(placeholderValue, shown)
      : undefined;

  return (
    <TextInput
      {...props}
      name={field.name}
      value={text}
      placeholder={placeholder}
      onChange={(e) => {
        setText(e.target.value);
        const n = parseDecimal(e.target.value);
        field.onChange(Number.isFinite(n) ? shown.fromShown(n) : Number.NaN);
      }}
      onBlur={() => {
        // leaving a field the rider never typed in is not a mistake yet: Next says what is missing
        if (text.trim() === '' && !fieldState.isDirty && !fieldState.isTouched) return;
        field.onBlur();
      }}
      inputRef={field.ref}
      error={!!fieldState.error}
      helperText={fieldState.error?.message ?? helperText}
      slotProps={{
        ...slotProps,
        htmlInput: { inputMode: 'decimal', autoComplete: 'off', ...slotProps?.htmlInput },
        input: shown.unit
          ? { endAdornment: <InputAdornment position="end">{shown.unit}</InputAdornment> }
          : undefined,
        // a placeholder (the model's default) stays readable: the label sits above it
        inputLabel: placeholder !== undefined ? { shrink: true } : undefined,
      }}
    />
  );
}

/* ------------------------------------------------------------------ large tappable choices */

export interface Choice<V extends string | number> {
  value: V;
  label: string;
  hint?: string;
}

type ChoiceFieldProps<T extends FieldValues, V extends string | number> = {
  name: FieldPath<T>;
  control: Control<T>;
  label: string;
  choices: readonly Choice<V>[];
  /** stacked full-width cards (phone) or a row of buttons */
  layout?: 'cards' | 'row' | 'wrap';
  helperText?: ReactNode;
};

/**
 * One of a few choices as large buttons (thumb-sized on a phone), wrapped once with Controller.
 * Each button says whether it is chosen (`aria-pressed`); the group is labelled.
 */
export function ChoiceField<T extends FieldValues, V extends string | number>({
  name,
  control,
  label,
  choices,
  layout = 'cards',
  helperText,
}: ChoiceFieldProps<T, V>) {
  const labelId = useId();
  return (
    <Controller
      name={name}
      control={control}
      render={({ field, fieldState }) => (
        <FormControl component="fieldset" error={!!fieldState.error} fullWidth sx={{ border: 0, p: 0, m: 0 }}>
          <FormLabel component="legend" id={labelId} sx={{ mb: 1, fontWeight: 500, color: 'text.primary' }}>
            {label}
          </FormLabel>
          <ToggleButtonGroup
            exclusive
            aria-labelledby={labelId}
            orientation={layout === 'cards' ? 'vertical' : 'horizontal'}
            value={field.value}
            onChange={(_e, v: V | null) => {
              if (v !== null) field.onChange(v);
            }}
            onBlur={(e) => {
              // moving between the choices is not leaving the question
              if (!e.currentTarget.contains(e.relatedTarget)) field.onBlur();
            }}
            fullWidth={layout !== 'wrap'}
            color="primary"
            sx={{
              ...(layout === 'wrap' && { flexWrap: 'wrap', gap: 1 }),
              ...(layout === 'cards' && { gap: 1 }),
              '& .MuiToggleButton-root': {
                justifyContent: layout === 'cards' ? 'flex-start' : 'center',
                textAlign: 'left',
                minHeight: layout === 'cards' ? 56 : 48,
                ...(layout === 'wrap' && { minWidth: 64, flex: '0 0 auto' }),
                px: 2,
                color: 'text.primary',
                bgcolor: 'background.paper',
                borderColor: fieldState.error ? 'error.main' : 'divider',
              },
              // separate cards: each keeps its own border and corners
              ...((layout === 'cards' || layout === 'wrap') && {
                '& .MuiToggleButtonGroup-grouped': {
                  borderRadius: '10px !important',
                  border: '1px solid',
                  borderColor: fieldState.error ? 'error.main' : 'divider',
                  m: '0 !important',
                },
              }),
              '& .MuiToggleButton-root.Mui-selected': {
                bgcolor: 'primary.main',
                color: 'primary.contrastText',
                borderColor: 'primary.main',
                '&:hover': { bgcolor: 'primary.dark' },
              },
            }}
          >
            {choices.map((c, i) => (
              <ToggleButton
                key={c.value}
                value={c.value}
                ref={i === 0 ? field.ref : undefined}
                aria-label={c.hint ? `${c.label}: ${c.hint}` : c.label}
              >
                <Box>
                  <Box component="span" sx={{ display: 'block', fontWeight: 500, fontSize: '1rem' }}>
                    {c.label}
                  </Box>
                  {c.hint && (
                    <Box component="span" sx={{ display: 'block', fontSize: '0.85rem', opacity: 0.85 }}>
                      {c.hint}
                    </Box>
                  )}
                </Box>
              </ToggleButton>
            ))}
          </ToggleButtonGroup>
          {(fieldState.error || helperText) && (
            <FormHelperText sx={{ mx: 0 }}>{fieldState.error?.message ?? helperText}</FormHelperText>
          )}
        </FormControl>
      )}
    />
  );
}

/* ------------------------------------------------------------------ a count with − and + */

type CountFieldProps<T extends FieldValues> = {
  name: FieldPath<T>;
  control: Control<T>;
  label: string;
  min?: number;
  max?: number;
  helperText?: ReactNode;
};

/** A small whole number (volume spacers) with large − and + buttons, wrapped once with Controller. */
export function CountField<T extends FieldValues>({
  name,
  control,
  label,
  min = 0,
  max = 12,
  helperText,
}: CountFieldProps<T>) {
  const labelId = useId();
  return (
    <Controller
      name={name}
      control={control}
      render={({ field, fieldState }) => {
        const n = Number.isFinite(field.value) ? (field.value as number) : 0;
        const set = (v: number) => field.onChange(Math.min(max, Math.max(min, v)));
        return (
          <FormControl error={!!fieldState.error} fullWidth>
            <Box sx={{ display: 'flex', alignItems: 'center', gap: 1 }}>
              <Typography id={labelId} sx={{ flexGrow: 1, fontWeight: 500 }}>
                {label}
              </Typography>
              <IconButton
                aria-label={`Fewer: ${label}`}
                onClick={() => set(n - 1)}
                disabled={n <= min}
                sx={{ border: 1, borderColor: 'divider', width: 48, height: 48 }}
              >
                <RemoveIcon />
              </IconButton>
              <Box
                role="status"
                aria-labelledby={labelId}
                sx={{ minWidth: 40, textAlign: 'center', fontSize: '1.25rem', fontWeight: 700 }}
                ref={field.ref}
                tabIndex={-1}
              >
                {n}
              </Box>
              <IconButton
                aria-label={`More: ${label}`}
                onClick={() => set(n + 1)}
                disabled={n >= max}
                sx={{ border: 1, borderColor: 'divider', width: 48, height: 48 }}
              >
                <AddIcon />
              </IconButton>
            </Box>
            {(fieldState.error || helperText) && (
              <FormHelperText sx={{ mx: 0 }}>{fieldState.error?.message ?? helperText}</FormHelperText>
            )}
          </FormControl>
        );
      }}
    />
  );
}
