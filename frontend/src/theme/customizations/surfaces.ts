import type { Components, Theme } from '@mui/material/styles';
import { focusRing, focusRingOnPine, line, paper, white } from '../primitives';

export const surfaceCustomizations: Components<Theme> = {
  MuiAppBar: {
    defaultProps: { elevation: 0, color: 'primary' },
  },
  MuiPaper: {
    styleOverrides: { outlined: { borderColor: line } },
  },
  MuiCard: {
    defaultProps: { variant: 'outlined' },
    styleOverrides: { root: { backgroundColor: white } },
  },
  MuiCssBaseline: {
    styleOverrides: {
      body: { backgroundColor: paper },
      // Keyboard focus is visible on every control: a ring outside the control, from the keyboard
      // only (:focus-visible), on paper and on the pine app bar alike (WCAG 2.x, 2.4.7).
      // (`:root` lifts the rule above MUI's own `outline: 0` on every button)
      ':root :focus-visible': { outline: `3px solid ${focusRing}`, outlineOffset: 2 },
      ':root .MuiAppBar-root :focus-visible, :root .on-pine :focus-visible': {
        outlineColor: focusRingOnPine,
      },
      // a text field shows its focus with its own 2 px primary border; a ring inside it would double it
      ':root input:focus-visible, :root textarea:focus-visible': { outline: 'none' },
      // headings and regions focused from script (a new step) are not controls: no ring
      ':root [tabindex="-1"]:focus': { outline: 'none' },
      '@media print': { body: { backgroundColor: white } },
    },
  },
};
