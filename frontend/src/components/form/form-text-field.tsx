import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';
import { controlledProps } from './controlled-props';
import { TextInput, type TextInputProps } from '@/components/ui/text-input';

export type FormTextFieldProps<T extends FieldValues> = Omit<
  TextInputProps,
  'name' | 'value' | 'onChange'
> & {
  name: FieldPath<T>;
  control: Control<T>;
};

/** A text input wrapped once with react-hook-form's Controller; errors show as helper text. */
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
        <TextInput {...props} {...controlledProps(field, fieldState, helperText)} />
      )}
    />
  );
}
