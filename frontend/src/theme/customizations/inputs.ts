import type { Components, Theme } from '@mui/material/styles';
import { inkMuted, inkPlaceholder } from '../primitives';

export const inputCustomizations: Components<Theme> = {
  // Keyboard focus shows as the theme's ring (surfaces.ts), not as MUI's grey focus ripple, which
  // covers the label and pulls its contrast down while it pulses.
  MuiButton: {
    defaultProps: { disableElevation: true, disableFocusRipple: true },
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
  MuiIconButton: { defaultProps: { disableFocusRipple: true } },
  MuiToggleButton: {
    defaultProps: { disableFocusRipple: true },
    // MUI's unchosen toggle text is 54 % black (about 4.6:1 on white, under 4.5:1 on paper)
    styleOverrides: { root: { textTransform: 'none', minHeight: 44, color: inkMuted } },
  },
};
