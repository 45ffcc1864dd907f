import VisibilityIcon from '@mui/icons-material/Visibility';
import VisibilityOffIcon from '@mui/icons-material/VisibilityOff';
import IconButton from '@mui/material/IconButton';
import InputAdornment from '@mui/material/InputAdornment';
import { useState } from 'react';
import type { FieldValues } from 'react-hook-form';
import { FormTextField, type FormTextFieldProps } from './form-text-field';

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
