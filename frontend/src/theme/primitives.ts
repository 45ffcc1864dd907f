/**
 * Loamline's own colour and shape tokens (PRODUCT.md, "Look and feel"): pine green, ochre,
 * warm paper, dark text, 10 px corners.
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
  500: '#C98B2B',
  700: '#9A6820',
} as const;

export const paper = '#F7F5F0';
export const ink = '#1E2421';
export const inkMuted = '#4D5651';
export const line = '#DDD8CC';

export const radius = 10;

export const fontFamily = ['Roboto', 'system-ui', 'Helvetica', 'Arial', 'sans-serif'].join(',');
