import { describe, expect, it } from 'vitest';
import { unitPrefs } from '@/lib/units';
import { BLANK_PART, checkValue, formValues, readValue, reportInput, showValue } from './report-form';
import { runChartData } from './run-chart';
import { run } from '../testing/fixtures';

const psi = unitPrefs('metric', 'psi');
const bar = unitPrefs('metric', 'bar');
const imperial = unitPrefs('imperial', 'psi');

describe('report form ranges', () => {
  it('takes blank (not measured), refuses junk and values out of range, in the unit shown', () => {
    expect(checkValue('mainPsi', '', psi)).toBeUndefined();
    expect(checkValue('mainPsi', 'abc', psi)).toBe('Enter a number');
    expect(checkValue('mainPsi', '0', psi)).toBe('Between 1 and 1,000 psi');
    expect(checkValue('mainPsi', '1001', psi)).toBe('Between 1 and 1,000 psi');
    expect(checkValue('mainPsi', '85', psi)).toBeUndefined();
    expect(checkValue('mainPsi', '5,9', bar)).toBeUndefined();
    expect(checkValue('mainPsi', '70', bar)).toBe('Between 0.07 and 68.95 bar');
    expect(checkValue('endStrokePsi', '4', psi)).toMatch(/^Between 5 and 1,000 psi/);
  });

  it('counts clicks and spacers in whole numbers within their ranges', () => {
    expect(checkValue('reboundClicks', '8.5', psi)).toBe('Enter a whole number');
    expect(checkValue('reboundClicks', '61', psi)).toBe('Between 0 and 60');
    expect(checkValue('compressionClicks', '0', psi)).toBeUndefined();
    expect(checkValue('spacers', '13', psi)).toBe('Between 0 and 12');
  });

  it('checks sag in mm or inches', () => {
    expect(checkValue('sagMm', '0.2', psi)).toBe('Between 0.5 and 260 mm');
    expect(checkValue('sagMm', '1.5', imperial)).toBeUndefined();
    expect(checkValue('sagMm', '11', imperial)).toBe('Between 0.02 and 10.24 in');
  });
});

describe('report form values ⇄ the API', () => {
  it('sends psi, mm and lb/in whatever the units shown; a blank part is null; coil drops the air fields', () => {
    const v = formValues(
      {
        checklist: [
          { label: ' Seals ', done: true },
          { label: '', done: false },
        ],
        notes: ' ok ',
        fork: null,
        shock: null,
      },
      bar,
    );
    v.fork = { ...BLANK_PART, mainPsi: '5.86', spacers: '1', sagMm: '38', reboundClicks: '8' };
    v.shock = { ...BLANK_PART, spring: 'coil', mainPsi: '200', springRateLbPerIn: '80' }; // 80 N/mm
    const input = reportInput(v, bar);
    expect(input.checklist).toEqual([{ label: 'Seals', done: true }]);
    expect(input.notes).toBe('ok');
    expect(input.fork).toEqual({
      mainPsi: 85,
      endStrokePsi: null,
      spacers: 1,
      springRateLbPerIn: null,
      reboundClicks: 8,
      compressionClicks: null,
      sagMm: 38,
    });
    expect(input.shock?.mainPsi).toBeNull();
    expect(input.shock?.springRateLbPerIn).toBeCloseTo(456.8, 1); // 80 N/mm × 25.4 ÷ 4.448…
    expect(reportInput({ ...v, fork: { ...BLANK_PART } }, bar).fork).toBeNull();
  });

  it('shows a saved value so that it comes back unchanged', () => {
    expect(showValue('mainPsi', 85, bar)).toBe('5.86');
    expect(readValue('mainPsi', '5.86', bar)).toBe(85);
    expect(showValue('sagMm', 38, imperial)).toBe('1.5');
    expect(readValue('sagMm', showValue('sagMm', 38, imperial), imperial)).toBe(38.1);
  });
});

describe('the run chart draws every measured row', () => {
  it('has as many points as the run, first and last equal, split by stroke in file order', () => {
    const d = runChartData(run, psi);
    expect(d.compression.length + d.rebound.length).toBe(run.points.length);
    expect(d.compression[0]).toMatchObject({ x: 0, y: 180 });
    expect(d.rebound[d.rebound.length - 1]).toMatchObject({ x: 0, y: 120 });
    expect(d.compression[d.compression.length - 1]).toMatchObject({ x: 140, y: 2100 });
    // the model sorted by travel, for its line
    expect(d.model.x).toEqual([0, 80, 140]);
    expect(d.model.compression).toEqual([170, 740, 1800]);
  });

  it('converts to inches and lbf for imperial', () => {
    const d = runChartData(run, imperial);
    expect(d.compression[3].x).toBeCloseTo(140 / 25.4, 6);
    expect(d.compression[3].y).toBeCloseTo(2100 / 4.4482216152605, 6);
  });
});
