import type { BaselineResult, BaselineWarning, PartResult } from '@loamline/shared-types';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { DEFAULT_UNITS } from '@/lib/units';
import { AppTheme } from '@/theme/app-theme';
import { part } from '../testing/wizard-test-utils';
import { AtThePump } from './at-the-pump';
import { PartResultCard, travelRows } from './part-result';
import { severityOf, sortWarnings } from './warnings';

// Made-up results in the contract's shape (shared-types/src/baselines.ts): these tests check how the
// cards order and word what the server says, not the physics.

const w = (code: string, severity: BaselineWarning['severity'] | undefined, message: string) =>
  ({ code, ...(severity ? { severity } : {}), message }) as BaselineWarning;

function renderCard(result: PartResult, fittedSpacers = 1) {
  return render(
    <AppTheme>
      <PartResultCard part="fork" result={result} units={DEFAULT_UNITS} fittedSpacers={fittedSpacers} />
    </AppTheme>,
  );
}

/** a before b in the document */
const before = (a: Element, b: Element): boolean =>
  !!(a.compareDocumentPosition(b) & Node.DOCUMENT_POSITION_FOLLOWING);

describe('warnings by severity', () => {
  it('puts errors first, then warnings, then advice, keeping the server order within a level', () => {
    const list = [
      w('temperature-offset', 'info', 'i1'),
      w('no-full-travel', 'warning', 'w1'),
      w('above-max-pressure', 'error', 'e1'),
      w('sag-out-of-range', 'warning', 'w2'),
    ];
    expect(sortWarnings(list).map((x) => x.message)).toEqual(['e1', 'w1', 'w2', 'i1']);
  });

  it('reads a warning without severity (a sheet saved before severities) as a warning', () => {
    expect(severityOf({})).toBe('warning');
    expect(severityOf({ severity: 'error' })).toBe('error');
  });

  it('shows each level distinctly, the error as an alert before the number it is about', () => {
    const r = part(160, 40, 84.36);
    r.warnings = [
      w('temperature-offset', 'info', 'Pumped indoors: set a little more.'),
      w('sag-out-of-range', 'warning', 'The target sag is unusual.'),
      w('end-stroke-below-main', 'error', 'Something impossible.'),
    ];
    renderCard(r);
    const card = screen.getByRole('region', { name: 'Fork' });
    const alerts = within(card).getAllByRole('alert');
    expect(alerts).toHaveLength(1);
    expect(alerts[0]).toHaveAttribute('data-severity', 'error');
    expect(alerts[0]).toHaveTextContent(/Stop:.*Something impossible/);
    const notes = within(card).getAllByRole('note');
    expect(notes.map((n) => n.getAttribute('data-severity'))).toEqual(['warning', 'info']);
    expect(notes[0]).toHaveTextContent('Warning:');
    expect(notes[1]).toHaveTextContent('Note:');
    expect(before(alerts[0], notes[0])).toBe(true);
    expect(before(alerts[0], screen.getByTestId('fork-pressure'))).toBe(true);
  });
});

describe('a pressure past its maximum', () => {
  function overMax(): PartResult {
    const r = part(160, 40, 172, 150);
    r.warnings = [w('above-max-pressure', 'error', 'The pressure this needs is too high.')];
    return r;
  }

  it('is blocked: the error first, naming which maximum and whose, the number not an instruction', () => {
    renderCard(overMax());
    const alert = screen.getByRole('alert');
    expect(within(alert).getByText("Don't pump past 150 psi")).toBeInTheDocument();
    expect(alert).toHaveTextContent(/the fork's main chamber is 150 psi \(Loamline's default/);
    const shown = screen.getByTestId('fork-pressure');
    expect(before(alert, shown)).toBe(true);
    expect(shown).toHaveAttribute('data-blocked', 'true');
    expect(screen.getByText('Worked out: do not set')).toBeInTheDocument();
    expect(screen.queryByText('Start at')).not.toBeInTheDocument();
    expect(screen.queryByText(/^range/)).not.toBeInTheDocument();
  });

  it("keeps the server's own words when its message already names the maximum", () => {
    const r = overMax();
    r.warnings = [
      w('above-max-pressure', 'error', "Needs 172 psi, above the fork's main-chamber maximum of 150 psi."),
    ];
    renderCard(r);
    const alert = screen.getByRole('alert');
    expect(alert).toHaveTextContent("Needs 172 psi, above the fork's main-chamber maximum of 150 psi.");
    expect(alert).not.toHaveTextContent("Loamline's default");
  });

  it('is blocked even when no warning says so (never past a maximum silently)', () => {
    const r = overMax();
    r.warnings = [];
    renderCard(r);
    expect(screen.getByTestId('fork-pressure')).toHaveAttribute('data-blocked', 'true');
  });

  it('gets no order of work at the pump, only the error and a word to see a technician', () => {
    const result: BaselineResult = { fork: overMax(), shock: null, cautions: [], assumptions: [] };
    render(
      <AppTheme>
        <AtThePump result={result} units={DEFAULT_UNITS} />
      </AppTheme>,
    );
    const pump = screen.getByRole('region', { name: 'At the pump' });
    expect(within(pump).getByRole('alert')).toHaveTextContent("Don't pump past 150 psi");
    expect(pump).not.toHaveTextContent(/pump to 172/i);
    expect(pump).toHaveTextContent(/qualified technician/);
  });

  it('shows no number at all when no positive pressure works (pressure null), the error first', () => {
    const r = part(160, 40, 84.36);
    r.pressure = null;
    r.warnings = [w('no-pressure', 'error', 'No pressure in this spring holds you at this sag.')];
    renderCard(r);
    const alert = screen.getByRole('alert');
    expect(screen.getByText('No safe pressure')).toBeInTheDocument();
    expect(screen.getByTestId('fork-pressure')).toHaveTextContent('—');
    expect(before(alert, screen.getByTestId('fork-pressure'))).toBe(true);
    expect(screen.queryByText('Start at')).not.toBeInTheDocument();
  });

  it('caps a range whose top is past the maximum', () => {
    const r = part(160, 40, 148, 150);
    r.warnings = [w('range-above-max-pressure', 'warning', 'The top of the range is above the maximum.')];
    renderCard(r);
    // 144 psi = 9.93 bar, 150 psi = 10.34 bar (NIST SP 811)
    expect(screen.getByRole('region', { name: 'Fork' })).toHaveTextContent(
      /range 144–150 psi \(9\.9–10\.3 bar\), never past the maximum/,
    );
    expect(screen.getByRole('note')).toHaveTextContent('Stay at or below 150 psi');
  });
});

describe('a sheet saved before the second pass', () => {
  it('shows old warnings as warnings and leaves out what it does not have', () => {
    const r = part(160, 40, 84.36) as unknown as Record<string, unknown>;
    const p = r.pressure as Record<string, unknown>;
    for (const k of ['rangeBar', 'maxPsi', 'maxIsDefault', 'minPsi', 'atRidePsi']) delete p[k];
    for (const k of ['rateAtSagNPerMm', 'energyToFullTravelJ', 'hardLandingIndex', 'endStroke']) delete r[k];
    r.warnings = [{ code: 'no-full-travel', message: 'Too progressive.' }];
    (r.overlays as { kind: string; label: string }[])[3].label = 'fast hit (n = 1.4)';
    renderCard(r as unknown as PartResult);
    const note = screen.getByRole('note');
    expect(note).toHaveAttribute('data-severity', 'warning');
    expect(note).toHaveTextContent('Too progressive.');
    expect(screen.getByTestId('fork-pressure')).toHaveTextContent('84 psi');
    expect(screen.getByText('Start at')).toBeInTheDocument();
    expect(screen.queryByText(/maximum/)).not.toBeInTheDocument();
    expect(screen.queryByText(/Stiffness at sag/)).not.toBeInTheDocument();
    // plain words: no "n = 1.4" on screen
    expect(document.body).not.toHaveTextContent('n = 1.4');
  });
});

describe('what the contract adds', () => {
  it('shows the range in bar from the server, the gauge where you ride, and the numbers behind it', () => {
    const r = part(160, 40, 84.36);
    if (!r.pressure) throw new Error('air');
    r.pressure.atRidePsi = 86.2;
    r.pressure.rangeBar = [5.5, 6.1];
    render(
      <AppTheme>
        <PartResultCard part="fork" result={r} units={{ ...DEFAULT_UNITS, pressure: 'bar' }} />
      </AppTheme>,
    );
    // 84.36 psi × 6894.757293168361 Pa/psi ÷ 100 000 Pa/bar = 5.816 bar (NIST SP 811)
    expect(screen.getByTestId('fork-pressure')).toHaveTextContent('5.8 bar');
    expect(screen.getByText('Set at the pump')).toBeInTheDocument();
    expect(screen.getByText(/range 5\.5–6\.1 bar/)).toBeInTheDocument();
    // 86.2 psi = 5.943 bar (NIST SP 811)
    expect(screen.getByTestId('fork-at-ride')).toHaveTextContent('reads 5.9 bar where you ride');
    expect(screen.getByText('12.3 N/mm')).toBeInTheDocument();
    expect(screen.getByText('96 J')).toBeInTheDocument();
  });

  it('marks an end-stroke pressure recommended or yours, with its own maximum', () => {
    const r = part(160, 40, 84.36);
    r.endStroke = {
      psi: 180,
      bar: 12.4,
      given: false,
      recommendedPsi: 180,
      recommendedBar: 12.4,
      recommendedTravelUsedMm: 150,
      maxPsi: 300,
      maxIsDefault: true,
    };
    renderCard(r);
    expect(screen.getByText('End-stroke (recommended)')).toBeInTheDocument();
    expect(screen.getByTestId('fork-end-stroke')).toHaveTextContent('180 psi');
    expect(screen.getByText(/max 300 psi \(default: check yours\)/)).toBeInTheDocument();
  });
});

describe('the travel-used table and the chart legend', () => {
  it('orders rows by what a rider changes: spacers 0…N (fitted marked), end-stroke low to high, as set', () => {
    const r = part(160, 40, 84.36);
    r.endStroke = {
      psi: 220,
      bar: 15.2,
      given: true,
      recommendedPsi: 200,
      recommendedBar: 13.8,
      recommendedTravelUsedMm: 140,
      maxPsi: 300,
      maxIsDefault: false,
    };
    const groups = travelRows(r, DEFAULT_UNITS, 1);
    expect(groups.map((g) => g.group)).toEqual(['Volume spacers', 'End-stroke pressure', 'As set']);
    expect(groups[0].rows.map((x) => [x.label.replace(/, hard landing$/, ''), x.mark])).toEqual([
      ['0 spacers (1 fewer)', undefined],
      ['1 spacer', 'fitted now'],
      ['2 spacers (1 more)', undefined],
    ]);
    expect(groups[1].rows.map((x) => [x.label.replace(/, hard landing$/, ''), x.mark])).toEqual([
      ['End-stroke 200 psi', 'recommended'],
      ['End-stroke 220 psi', 'yours, as set'],
    ]);
    expect(groups[2].rows).toHaveLength(1);
  });

  it('lets each curve be hidden and shown again from a keyboard-reachable legend', async () => {
    const user = userEvent.setup({ delay: null });
    renderCard(part(160, 40, 84.36));
    const legend = screen.getByRole('group', { name: /Curves on the chart/ });
    const buttons = within(legend).getAllByRole('button');
    expect(buttons.map((b) => b.textContent)).toEqual([
      'Slow push (sag), as set',
      '2 spacers (1 more)',
      '0 spacers (1 fewer)',
      'End-stroke 200 psi',
      'Hard landing, as set',
    ]);
    const spacers = buttons[1];
    expect(spacers).toHaveAttribute('aria-pressed', 'true');
    spacers.focus();
    await user.keyboard('{Enter}');
    expect(spacers).toHaveAttribute('aria-pressed', 'false');
    await user.keyboard(' ');
    expect(spacers).toHaveAttribute('aria-pressed', 'true');
  });
});
