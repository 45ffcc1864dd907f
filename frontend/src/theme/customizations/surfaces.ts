import type { Components, Theme } from '@mui/material/styles';
import { line, paper } from '../primitives';

export const surfaceCustomizations: Components<Theme> = {
  MuiAppBar: {
    defaultProps: { elevation: 0, color: 'primary' },
  },
  MuiPaper: {
    styleOverrides: { outlined: { borderColor: line } },
  },
  MuiCard: {
    defaultProps: { variant: 'outlined' },
    styleOverrides: { root: { backgroundColor: '#FFFFFF' } },
  },
  MuiCssBaseline: {
    styleOverrides: {
      body: { backgroundColor: paper },
      '@media print': { body: { backgroundColor: '#FFFFFF' } },
    },
  },
};
