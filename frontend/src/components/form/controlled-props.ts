import type { ControllerFieldState, ControllerRenderProps, FieldPath, FieldValues } from 'react-hook-form';
import type { ReactNode } from 'react';

/**
 * What an MUI input takes from react-hook-form's Controller, said once for every form field kind
 * (form-text-field.tsx, form-select-field.tsx): the value (never undefined, so the input stays
 * controlled), the handlers and ref, and the field's error as its helper text.
 */
export function controlledProps<T extends FieldValues, N extends FieldPath<T>>(
  field: ControllerRenderProps<T, N>,
  fieldState: ControllerFieldState,
  helperText: ReactNode,
) {
  return {
    name: field.name,
    value: field.value ?? '',
    onChange: field.onChange,
    onBlur: field.onBlur,
    inputRef: field.ref,
    error: !!fieldState.error,
    helperText: fieldState.error?.message ?? helperText,
  };
}
