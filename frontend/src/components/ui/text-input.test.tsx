import Autocomplete from '@mui/material/Autocomplete';
import InputAdornment from '@mui/material/InputAdornment';
import { ThemeProvider } from '@mui/material/styles';
import TextField from '@mui/material/TextField';
import { render } from '@testing-library/react';
import type { ReactElement } from 'react';
import { describe, expect, it } from 'vitest';
import { theme } from '@/theme/app-theme';
import { TextInput, type TextInputProps } from './text-input';

/** The markup of an element under the app's theme, with React's generated ids made stable. */
function html(element: ReactElement): string {
  const { container, unmount } = render(<ThemeProvider theme={theme}>{element}</ThemeProvider>);
  const out = container.innerHTML
    .replace(/_r_\w+_/g, 'ID')
    // TextField's root only adds its own class name (and so a different emotion class), no styles
    .replace(/ MuiTextField-root/g, '')
    .replace(/css-\w+-MuiFormControl-root(-MuiTextField-root)?/, 'css-root');
  unmount();
  return out;
}

const ignore = () => {};

const cases: [string, TextInputProps][] = [
  ['plain', { label: 'E-mail', type: 'email', autoComplete: 'email', name: 'email', value: '' }],
  [
    'required, with an error',
    { label: 'Name', required: true, error: true, helperText: 'Missing', value: 'x' },
  ],
  ['small, disabled', { label: 'Item', size: 'small', disabled: true, value: '', helperText: ' ' }],
  [
    'multiline',
    { label: 'Notes', multiline: true, minRows: 3, value: 'a', slotProps: { htmlInput: { maxLength: 20 } } },
  ],
  [
    'adornment',
    {
      label: 'Amount',
      value: '',
      slotProps: { input: { startAdornment: <InputAdornment position="start">€</InputAdornment> } },
    },
  ],
  [
    'label kept above a placeholder',
    {
      label: 'Travel',
      placeholder: '160',
      value: '',
      fullWidth: false,
      slotProps: { inputLabel: { shrink: true } },
    },
  ],
  ['no label', { value: 'a', helperText: 'Help' }],
];

describe('TextInput', () => {
  it.each(cases)('draws what TextField draws: %s', (_name, props) => {
    expect(html(<TextInput id="f" onChange={ignore} {...props} />)).toBe(
      html(<TextField id="f" onChange={ignore} {...props} />),
    );
  });

  it('works as an Autocomplete input like TextField', () => {
    const field = (Input: typeof TextField | typeof TextInput) => (
      <Autocomplete
        options={['a', 'b']}
        value="a"
        size="small"
        renderInput={(params) => <Input {...params} label="Zone" error helperText="Pick one" />}
      />
    );
    expect(html(field(TextInput))).toBe(html(field(TextField)));
  });
});
