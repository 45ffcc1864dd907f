import Box from '@mui/material/Box';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';

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
