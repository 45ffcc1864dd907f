import type { Components, Theme } from '@mui/material/styles';
import { inkPlaceholder } from '../primitives';

export const inputCustomizations: Components<Theme> = {
  MuiButton: {
    defaultProps: { disableElevation: true },
    styleOverrides: {
      root: { textTransform: 'none', fontWeight: 500 },
      sizeLarge: { minHeight: 48, paddingInline: 24 },
    },
  },
  MuiInputBase: {
    styleOverrides: {
      // MUI greys a placeholder to 42 % opacity (about 2.5:1); this one reads at 4.5:1 or more
      input: { '&::placeholder': { color: inkPlaceholder, opacity: 1 } },
    },
  },
  MuiTextField: { defaultProps: { fullWidth: true } },
  MuiToggleButton: {
    styleOverrides: { root: { textTransform: 'none', minHeight: 44 } },
  },
};
