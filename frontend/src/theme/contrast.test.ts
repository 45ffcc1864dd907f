import { describe, expect, it } from 'vitest';
import { theme } from './app-theme';
import { contrastRatio } from './contrast';
import {
  cautionPaper,
  focusRing,
  focusRingOnPine,
  ink,
  inkMuted,
  inkPlaceholder,
  ochre,
  paper,
  pine,
  white,
} from './primitives';

/*
 * Every text/background pair the theme and the wizard use, at WCAG 2.x success criterion 1.4.3
 * (contrast minimum, AA): 4.5:1 for text; 3:1 for a focus ring against what is around it
 * (SC 1.4.11, non-text contrast). Formula: WCAG 2.x relative luminance and contrast ratio
 * (theme/contrast.ts).
 */
const TEXT = 4.5;
const NON_TEXT = 3;
const p = theme.palette;
const STATUSES = ['error', 'warning', 'info', 'success'] as const;

describe('the WCAG 2.x contrast formula', () => {
  it('gives the definition’s end points and a known pair', () => {
    expect(contrastRatio('#FFFFFF', '#000000')).toBeCloseTo(21, 10); // (1 + 0.05) / (0 + 0.05)
    expect(contrastRatio('#777', '#fff')).toBeCloseTo(4.48, 2); // the usual "just fails AA" grey
    expect(contrastRatio('rgb(255, 255, 255)', '#ffffff')).toBe(1);
  });
});

describe('theme palette pairs (WCAG 2.x SC 1.4.3, 4.5:1 for text)', () => {
  const surfaces = { paper, white, 'pine 50 (sag answer)': pine[50], 'caution box': cautionPaper };
  const texts: Record<string, string> = {
    'text.primary': p.text.primary,
    'text.secondary': p.text.secondary,
    'primary.main (links, outlined buttons)': p.primary.main,
    'primary.dark (figures, headings)': p.primary.dark,
    'secondary.dark (ochre text)': p.secondary.dark,
    placeholder: inkPlaceholder,
    ...Object.fromEntries(STATUSES.map((s) => [`${s}.main (helper text, icons)`, p[s].main])),
  };
  for (const [textName, fg] of Object.entries(texts)) {
    for (const [bgName, bg] of Object.entries(surfaces)) {
      it(`${textName} on ${bgName}`, () => expect(contrastRatio(fg, bg)).toBeGreaterThanOrEqual(TEXT));
    }
  }

  const filled: [string, string, string][] = [
    ['primary: contained button, app bar, chosen card', p.primary.contrastText, p.primary.main],
    ['primary.dark: hovered button', p.primary.contrastText, p.primary.dark],
    ['secondary: ochre button', p.secondary.contrastText, p.secondary.main],
    ...STATUSES.map((s): [string, string, string] => [
      `${s}: filled alert, chip`,
      p[s].contrastText,
      p[s].main,
    ]),
    // what MUI's filled Alert picks by itself
    ...STATUSES.map((s): [string, string, string] => [
      `${s}: filled alert (getContrastText)`,
      p.getContrastText(p[s].main),
      p[s].main,
    ]),
  ];
  for (const [name, fg, bg] of filled) {
    it(`text on ${name}`, () => expect(contrastRatio(fg, bg)).toBeGreaterThanOrEqual(TEXT));
  }

  // MUI's standard Alert: text darken(light, 0.6) on lighten(light, 0.9); outlined: the same text on the page
  for (const s of STATUSES) {
    const fg = theme.darken(p[s].light, 0.6);
    it(`${s} alert, standard`, () =>
      expect(contrastRatio(fg, theme.lighten(p[s].light, 0.9))).toBeGreaterThanOrEqual(TEXT));
    it(`${s} alert, outlined on paper`, () => expect(contrastRatio(fg, paper)).toBeGreaterThanOrEqual(TEXT));
  }

  it('step numbers: white on the stepper’s circles (inactive, active, done)', () => {
    for (const circle of [inkMuted, ochre[700], pine[500]]) {
      expect(contrastRatio(white, circle)).toBeGreaterThanOrEqual(TEXT);
    }
  });

  it('the home page’s pine band: white text and the ochre line over it', () => {
    expect(contrastRatio(white, pine[500])).toBeGreaterThanOrEqual(TEXT);
    expect(contrastRatio(ochre[100], pine[500])).toBeGreaterThanOrEqual(TEXT);
  });

  it('ink on ochre 500, never white (white on it is under 3:1)', () => {
    expect(contrastRatio(ink, ochre[500])).toBeGreaterThanOrEqual(TEXT);
    expect(contrastRatio(white, ochre[500])).toBeLessThan(NON_TEXT);
  });
});

describe('keyboard focus ring (WCAG 2.x SC 1.4.11, 3:1 against adjacent colours)', () => {
  it('stands out from paper and white, and from the pine app bar', () => {
    expect(contrastRatio(focusRing, paper)).toBeGreaterThanOrEqual(NON_TEXT);
    expect(contrastRatio(focusRing, white)).toBeGreaterThanOrEqual(NON_TEXT);
    expect(contrastRatio(focusRingOnPine, pine[500])).toBeGreaterThanOrEqual(NON_TEXT);
  });
});
