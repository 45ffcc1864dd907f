import { describe, expect, it } from 'vitest';
import { unitPrefs } from '@/lib/units';
import { riderText } from './plain-text';

// Riders never read internal references (the brief, "plain language first").
describe('riderText', () => {
  it('drops file references and puts bare symbols in words', () => {
    expect(riderText('estimate (Loamline default geometry, see docs/spring-model.md)')).toBe(
      'estimate (Loamline default geometry)',
    );
    expect(riderText('as in spring-model.md, the hard landing')).toBe('as in, the hard landing');
    expect(riderText('fast hit (n = 1.4)')).toBe('fast hit (air index 1.4)');
    expect(riderText('Set it above the main chamber.')).toBe('Set it above the main chamber.');
  });
});

// The server writes psi, mm, m and °C; a rider reading bar, inches, feet or °F sees those.
describe('riderText in the rider units', () => {
  const imperialBar = unitPrefs('imperial', 'bar');
  it('leaves the text alone in the API units', () => {
    const t = 'Pump to 67 psi where you pump (91 m); 160 mm travel at 4.4 °C.';
    expect(riderText(t, unitPrefs('metric', 'psi'))).toBe(t);
  });
  it('puts pressures, lengths, altitudes and temperatures in the rider units', () => {
    expect(
      riderText(
        'Pump to 67 psi where you pump (91 m). The chamber keeps its air, so where you ride (2438 m) the gauge reads about 71 psi: that is the same setting.',
        imperialBar,
      ),
    ).toBe(
      'Pump to 4.6 bar where you pump (300 ft). The chamber keeps its air, so where you ride (8,000 ft) the gauge reads about 4.9 bar: that is the same setting.',
    );
    expect(
      riderText(
        '67 psi is what the gauge should read at 4.4 °C. Pumped indoors at 20 °C, set about 72 psi.',
        imperialBar,
      ),
    ).toBe('4.6 bar is what the gauge should read at 40 °F. Pumped indoors at 68 °F, set about 5.0 bar.');
    expect(riderText('would use only 141 of 160 mm: too progressive', imperialBar)).toBe(
      'would use only 5.55 of 6.30 in: too progressive',
    );
    expect(riderText('1,000 psi is above the maximum of 150 psi', unitPrefs('metric', 'bar'))).toBe(
      '68.9 bar is above the maximum of 10.3 bar',
    );
  });
  it('keeps stanchion sizes in mm', () => {
    expect(riderText('Loamline default for 36 mm stanchions', imperialBar)).toBe(
      'Loamline default for 36 mm stanchions',
    );
  });
});
