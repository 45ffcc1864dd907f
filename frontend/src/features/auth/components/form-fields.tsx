import VisibilityIcon from '@mui/icons-material/Visibility';
import VisibilityOffIcon from '@mui/icons-material/VisibilityOff';
import Box from '@mui/material/Box';
import FormControlLabel from '@mui/material/FormControlLabel';
import IconButton from '@mui/material/IconButton';
import InputAdornment from '@mui/material/InputAdornment';
import Switch from '@mui/material/Switch';
import TextField, { type TextFieldProps } from '@mui/material/TextField';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';

type FormTextFieldProps<T extends FieldValues> = Omit<TextFieldProps, 'name' | 'value' | 'onChange'> & {
  name: FieldPath<T>;
  control: Control<T>;
};

/** MUI's TextField wrapped once with react-hook-form's Controller; errors show as helper text. */
export function FormTextField<T extends FieldValues>({
  name,
  control,
  helperText,
  ...props
}: FormTextFieldProps<T>) {
  return (
    <Controller
      name={name}
      control={control}
      render={({ field, fieldState }) => (
        <TextField
          {...props}
          name={field.name}
          value={field.value ?? ''}
          onChange={field.onChange}
          onBlur={field.onBlur}
          inputRef={field.ref}
          error={!!fieldState.error}
          helperText={fieldState.error?.message ?? helperText}
        />
      )}
    />
  );
}

/** A password input with a show/hide switch (easier to get right on a phone). */
export function FormPasswordField<T extends FieldValues>(props: FormTextFieldProps<T>) {
  const [shown, setShown] = useState(false);
  return (
    <FormTextField
      {...props}
      type={shown ? 'text' : 'password'}
      slotProps={{
        input: {
          endAdornment: (
            <InputAdornment position="end">
              <IconButton
                aria-label={shown ? 'Hide password' : 'Show password'}
                onClick={() => setShown((s) => !s)}
                edge="end"
              >
                {shown ? <VisibilityOffIcon /> : <VisibilityIcon />}
              </IconButton>
            </InputAdornment>
          ),
        },
      }}
    />
  );
}

type ControlledProps<T extends FieldValues> = { name: FieldPath<T>; control: Control<T> };

/** A row of choices (MUI ToggleButtonGroup, exclusive), wrapped once with Controller. */
export function FormToggleField<T extends FieldValues>({
  name,
  control,
  label,
  options,
}: ControlledProps<T> & { label: string; options: readonly { value: string; label: string }[] }) {
  return (
    <Controller
      name={name}
      control={control}
      render={({ field }) => (
        <Box>
          <Typography variant="body2" color="text.secondary" id={`${field.name}-label`} sx={{ mb: 0.75 }}>
            {label}
          </Typography>
          <ToggleButtonGroup
            exclusive
            fullWidth
            color="primary"
            size="small"
            value={field.value}
            onChange={(_e, value: string | null) => value !== null && field.onChange(value)}
            aria-labelledby={`${field.name}-label`}
          >
            {options.map((o) => (
              <ToggleButton key={o.value} value={o.value}>
                {o.label}
              </ToggleButton>
            ))}
          </ToggleButtonGroup>
        </Box>
      )}
    />
  );
}

/** An on/off switch with its label, wrapped once with Controller. */
export function FormSwitchField<T extends FieldValues>({
  name,
  control,
  label,
}: ControlledProps<T> & { label: string }) {
  return (
    <Controller
      name={name}
      control={control}
      render={({ field }) => (
        <FormControlLabel
          control={
            <Switch
              checked={!!field.value}
              onChange={(e) => field.onChange(e.target.checked)}
              onBlur={field.onBlur}
              slotProps={{ input: { ref: field.ref } }}
            />
          }
          label={label}
        />
      )}
    />
  );
}
