import type { Assumption } from '@loamline/shared-types';
import { describe, expect, it } from 'vitest';
import { unitPrefs } from '@/lib/units';
import { assumptionText } from './baseline-step';

// A rider never reads a raw "101,325 Pa": the air around them is in their gauge's unit.
describe('assumptionText', () => {
  const air = {
    key: 'conditions.ambientPa',
    label: 'Air pressure around you where you ride',
    value: 101_325,
    unit: 'Pa',
    source: 'standard atmosphere',
  } satisfies Assumption;
  it('shows the air pressure around you in psi or bar', () => {
    expect(assumptionText(air, unitPrefs('metric', 'psi'))).toBe('14.7 psi');
    expect(assumptionText(air, unitPrefs('imperial', 'bar'))).toBe('1.01 bar');
  });
});
