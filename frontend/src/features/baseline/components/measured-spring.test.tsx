import type { PartResult } from '@loamline/shared-types';
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { DEFAULT_UNITS, unitPrefs } from '@/lib/units';
import { AppTheme } from '@/theme/app-theme';
import { part } from '../testing/wizard-test-utils';
import type { MeasuredSpringNote } from './measured-spring';
import { PartResultCard } from './part-result';

const measured = (r: PartResult, m: MeasuredSpringNote) => ({ ...r, measuredSpring: m }) as PartResult;

function renderCard(result: PartResult, units = DEFAULT_UNITS) {
  return render(
    <AppTheme>
      <PartResultCard part="fork" result={result} units={units} fittedSpacers={1} />
    </AppTheme>,
  );
}

describe('a baseline from the bike’s measured spring', () => {
  const m: MeasuredSpringNote = {
    label: 'measured on 15 June 2027 at Ridge Works',
    defaultPressurePsi: 92,
    differencePct: 8.2,
  };

  it('names the measurement and how far the default would have been off', () => {
    renderCard(measured(part(160, 40, 85), m));
    const note = screen.getByTestId('fork-measured-spring');
    expect(note).toHaveTextContent('Geometry measured on 15 June 2027 at Ridge Works');
    expect(note).toHaveTextContent('Loamline’s default geometry would have said 92 psi: 8.2 % too high.');
  });

  it('in bar, and lower than this baseline', () => {
    renderCard(
      measured(part(160, 40, 85), { ...m, defaultPressurePsi: 78, differencePct: -8.2 }),
      unitPrefs('metric', 'bar'),
    );
    expect(screen.getByTestId('fork-measured-spring')).toHaveTextContent(
      'would have said 5.4 bar: 8.2 % too low.',
    );
  });

  it('says nothing for a result without one', () => {
    renderCard(part(160, 40, 85));
    expect(screen.queryByTestId('fork-measured-spring')).not.toBeInTheDocument();
  });
});
