import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { DEFAULT_UNITS, unitPrefs } from '@/lib/units';
import { AppTheme } from '@/theme/app-theme';
import { run } from '../testing/fixtures';
import { RunCard } from './run-card';

describe('a bench run', () => {
  it('draws every measured point against the model, and names the run’s settings', async () => {
    render(
      <AppTheme>
        <RunCard run={run} prefs={DEFAULT_UNITS} />
      </AppTheme>,
    );
    const chart = await screen.findByTestId('run-chart');
    expect(chart).toHaveAttribute('data-points', String(run.points.length));
    expect(chart).toHaveAccessibleName(
      'End-stroke 190 psi: force against travel: 4 compression and 3 rebound points against the model',
    );
    const card = screen.getByRole('article', { name: 'End-stroke 190 psi' });
    expect(card).toHaveTextContent(
      'Fork · 85 psi main, end-stroke 190 psi, 1 spacer · file in mm and N · 7 points',
    );
  });

  it('reads the comparison in the user’s units: force at sag and near the end, friction band, bump stop', () => {
    render(
      <AppTheme>
        <RunCard run={run} prefs={unitPrefs('imperial', 'psi')} />
      </AppTheme>,
    );
    const table = screen.getByRole('table', { name: 'End-stroke 190 psi: measured against the model' });
    expect(
      within(table).getByRole('row', { name: 'Sag (1.57 in) 117 lbf 112 lbf +4.0 %' }),
    ).toBeInTheDocument();
    expect(
      within(table).getByRole('row', { name: /^Near the end \(5\.31 in\) 427 lbf 382 lbf \+11\.8 %$/ }),
    ).toBeInTheDocument();
    expect(within(table).getByRole('row', { name: /^Friction band ± 7 lbf/ })).toBeInTheDocument();
    expect(screen.getByTestId('bump-stop')).toHaveTextContent('at 5.43 in');
  });
});
