/**
 * Loamline's own colour and shape tokens (docs/architecture.md, "Look"): pine green, ochre,
 * warm paper, dark text, 10 px corners. Every text colour here reads at 4.5:1 or more on the
 * backgrounds the theme puts it on (WCAG 2.x, 1.4.3); theme/contrast.test.ts checks each pair.
 */
export const pine = {
  50: '#EEF4F1',
  100: '#D3E3DC',
  300: '#7FA596',
  500: '#2F5D50',
  700: '#234739',
  900: '#152B23',
} as const;

export const ochre = {
  100: '#F6E6C8',
  300: '#E0B567',
  /** a fill and a line colour; text on it is ink, never white (white on it reads 2.9:1) */
  500: '#C98B2B',
  /** dark enough for text on paper (was #9A6820: 4.4:1 on paper) */
  700: '#8C5E1C',
} as const;

export const paper = '#F7F5F0';
export const white = '#FFFFFF';
export const ink = '#1E2421';
export const inkMuted = '#4D5651';
/** a blank field's placeholder (the model's default): lighter than typed text, still 4.5:1 on paper */
export const inkPlaceholder = '#626966';
export const line = '#DDD8CC';
/** the warm background of the cautions box */
export const cautionPaper = '#FFF8EA';

/**
 * Status colours, each with white text on it (filled alerts, chips, buttons) and as text on paper
 * (helper text, icons): MUI's defaults give white on orange at 3.1:1 and white on light blue at 3.9:1.
 */
export const status = {
  error: '#B3261E',
  warning: '#A14E00',
  info: '#1F5F8B',
  success: '#2E6B3A',
} as const;

/** Keyboard focus: a ring that stands out 3:1 from paper and white, and from the pine app bar. */
export const focusRing = pine[700];
export const focusRingOnPine = ochre[300];

export const radius = 10;

export const fontFamily = ['Roboto', 'system-ui', 'Helvetica', 'Arial', 'sans-serif'].join(',');
