import FormControlLabel from '@mui/material/FormControlLabel';
import Switch from '@mui/material/Switch';
import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';

type ControlledProps<T extends FieldValues> = { name: FieldPath<T>; control: Control<T> };

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
