import TextField, { type TextFieldProps } from '@mui/material/TextField';
import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';
import { controlledProps } from './controlled-props';

type FormSelectFieldProps<T extends FieldValues> = Omit<
  TextFieldProps,
  'name' | 'value' | 'onChange' | 'select'
> & {
  name: FieldPath<T>;
  control: Control<T>;
};

/**
 * A select (MUI TextField `select`, its MenuItems as children) wrapped once with Controller. Kept
 * apart from FormTextField: only pages that draw a select load MUI's Select and Menu.
 */
export function FormSelectField<T extends FieldValues>({
  name,
  control,
  helperText,
  ...props
}: FormSelectFieldProps<T>) {
  return (
    <Controller
      name={name}
      control={control}
      render={({ field, fieldState }) => (
        <TextField {...props} select {...controlledProps(field, fieldState, helperText)} />
      )}
    />
  );
}
