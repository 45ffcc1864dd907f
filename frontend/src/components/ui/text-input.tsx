import FormControl, { type FormControlProps } from '@mui/material/FormControl';
import FormHelperText, { type FormHelperTextProps } from '@mui/material/FormHelperText';
import type { InputBaseComponentProps } from '@mui/material/InputBase';
import InputLabel, { type InputLabelProps } from '@mui/material/InputLabel';
import OutlinedInput, { type OutlinedInputProps } from '@mui/material/OutlinedInput';
import { useDefaultProps } from '@mui/material/DefaultPropsProvider';
import { useId, type ReactNode, type Ref } from 'react';

export interface TextInputProps extends Omit<
  FormControlProps,
  'onChange' | 'onBlur' | 'onFocus' | 'children' | 'variant' | 'defaultValue'
> {
  label?: ReactNode;
  helperText?: ReactNode;
  id?: string;
  name?: string;
  type?: string;
  autoComplete?: string;
  autoFocus?: boolean;
  placeholder?: string;
  value?: unknown;
  defaultValue?: unknown;
  onChange?: OutlinedInputProps['onChange'];
  onBlur?: OutlinedInputProps['onBlur'];
  onFocus?: OutlinedInputProps['onFocus'];
  inputRef?: Ref<HTMLInputElement>;
  multiline?: boolean;
  rows?: number | string;
  minRows?: number | string;
  maxRows?: number | string;
  /** the same slots as TextField's, objects only: the field box, the <input>, the label, the helper text */
  slotProps?: {
    input?: Partial<OutlinedInputProps>;
    htmlInput?: InputBaseComponentProps;
    inputLabel?: Partial<InputLabelProps>;
    formHelperText?: Partial<FormHelperTextProps>;
  };
}

/**
 * An outlined text input that looks, labels and describes itself exactly like MUI's TextField, built
 * from the parts MUI's docs suggest composing. TextField always bundles Select, and with it Menu,
 * Popover, Modal and List (about 25 kB gzipped) even when no field is a select: fields that are
 * selects keep TextField `select`, so only their pages pay for the menu.
 */
export function TextInput(inProps: TextInputProps) {
  // the theme's TextField defaults (fullWidth) apply here too, so both kinds of field line up
  const props = useDefaultProps({
    props: inProps as Record<string, unknown>,
    name: 'MuiTextField',
  }) as TextInputProps;
  const {
    label,
    helperText,
    id: idOverride,
    name,
    type,
    autoComplete,
    autoFocus = false,
    placeholder,
    value,
    defaultValue,
    onChange,
    onBlur,
    onFocus,
    inputRef,
    multiline = false,
    rows,
    minRows,
    maxRows,
    fullWidth = false,
    slotProps = {},
    ...formControlProps
  } = props;
  const reactId = useId();
  const id = idOverride ?? reactId;
  // the same ids TextField gives, so labels and descriptions tie up the same way
  const helperTextId = helperText && id ? `${id}-helper-text` : undefined;
  const inputLabelId = label && id ? `${id}-label` : undefined;
  const labelProps = slotProps.inputLabel;

  return (
    <FormControl variant="outlined" fullWidth={fullWidth} {...formControlProps}>
      {label != null && label !== '' && (
        <InputLabel htmlFor={id} id={inputLabelId} {...labelProps}>
          {label}
        </InputLabel>
      )}
      <OutlinedInput
        aria-describedby={helperTextId}
        autoComplete={autoComplete}
        autoFocus={autoFocus}
        defaultValue={defaultValue}
        fullWidth={fullWidth}
        multiline={multiline}
        name={name}
        rows={rows}
        maxRows={maxRows}
        minRows={minRows}
        type={type}
        value={value}
        id={id}
        inputRef={inputRef}
        onBlur={onBlur}
        onChange={onChange}
        onFocus={onFocus}
        placeholder={placeholder}
        inputProps={slotProps.htmlInput}
        // the outline leaves its gap for the label
        label={label}
        notched={labelProps?.shrink}
        {...slotProps.input}
      />
      {helperText && (
        <FormHelperText id={helperTextId} {...slotProps.formHelperText}>
          {helperText}
        </FormHelperText>
      )}
    </FormControl>
  );
}
