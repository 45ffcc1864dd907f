import { describe, expect, it } from 'vitest';
import { riderText } from './plain-text';

// Riders never read internal references (the brief, "plain language first").
describe('riderText', () => {
  it('drops file references and puts bare symbols in words', () => {
    expect(riderText('estimate (Loamline default geometry, see docs/spring-model.md)')).toBe(
      'estimate (Loamline default geometry)',
    );
    expect(riderText('as in SPRING-MODEL.md, the hard landing')).toBe('as in, the hard landing');
    expect(riderText('fast hit (n = 1.4)')).toBe('fast hit (air index 1.4)');
    expect(riderText('Set it above the main chamber.')).toBe('Set it above the main chamber.');
  });
});
