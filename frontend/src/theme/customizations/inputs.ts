import type { Components, Theme } from '@mui/material/styles';

export const inputCustomizations: Components<Theme> = {
  MuiButton: {
    defaultProps: { disableElevation: true },
    styleOverrides: {
      root: { textTransform: 'none', fontWeight: 500 },
      sizeLarge: { minHeight: 48, paddingInline: 24 },
    },
  },
  MuiTextField: { defaultProps: { fullWidth: true } },
  MuiToggleButton: {
    styleOverrides: { root: { textTransform: 'none', minHeight: 44 } },
  },
};
