import type { BaselineInput, BaselineResult, PartResult, ShockResult } from '@loamline/shared-types';
import { render } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter, useNavigate } from 'react-router';
import { SWRConfig } from 'swr';
import { AppTheme } from '@/theme/app-theme';
import { BaselineWizard } from '../components/baseline-wizard';
import { BaselineWizardProvider } from '../hooks/use-baseline-wizard';

/**
 * A server answer in the contract's shape for the component tests. The numbers are made up: these
 * tests check how the browser shows and sends them, not the physics (the backend's tests do that).
 */
export function part(travelMm: number, sagMm: number, psi: number, maxPsi = 150): PartResult {
  const curve = Array.from({ length: 11 }, (_, i) => ({
    travelMm: (travelMm * i) / 10,
    forceN: 200 + 40 * i * i,
  }));
  const bar = (p: number) => (p * 6894.757293168361) / 100_000; // NIST SP 811
  return {
    travelMm,
    targetSagPct: (100 * sagMm) / travelMm,
    targetSagMm: sagMm,
    loadN: 340,
    pressure: {
      psi,
      bar: bar(psi),
      rangePsi: [Math.round(psi - 4.4), Math.round(psi + 4.6)],
      rangeBar: [Math.round(bar(psi - 4.4) * 10) / 10, Math.round(bar(psi + 4.6) * 10) / 10],
      maxPsi,
      maxIsDefault: true,
      minPsi: 30,
      atRidePsi: null,
    },
    coilRate: null,
    endStroke: null,
    curve,
    rateAtSagNPerMm: 12.34,
    energyToFullTravelJ: 96.4,
    progression: 2.9,
    hardLandingLoadN: 1020,
    hardLandingIndex: 1.4,
    travelUsedMm: travelMm * 0.93,
    overlays: [
      {
        label: '2 spacers (1 more)',
        kind: 'spacers',
        spacers: 2,
        curve: curve.map((p) => ({ ...p, forceN: p.forceN * 1.1 })),
        progression: 3.2,
        travelUsedMm: travelMm * 0.88,
      },
      {
        label: '0 spacers (1 fewer)',
        kind: 'spacers',
        spacers: 0,
        curve: curve.map((p) => ({ ...p, forceN: p.forceN * 0.95 })),
        progression: 2.6,
        travelUsedMm: travelMm,
      },
      {
        label: 'end-stroke 200 psi',
        kind: 'end-stroke',
        endStrokePsi: 200,
        curve,
        progression: 3.5,
        travelUsedMm: travelMm * 0.85,
      },
      {
        label: 'hard landing',
        kind: 'fast-hit',
        curve: curve.map((p) => ({ ...p, forceN: p.forceN * 1.2 })),
        progression: 3.9,
        travelUsedMm: travelMm * 0.93,
      },
    ],
    warnings: [],
  };
}

export function fakeResult(): BaselineResult {
  const shock: ShockResult = {
    ...part(65, 19.5, 221.7, 350),
    leverageRatio: 2.538,
    leverageRatioIsAverage: true,
    wheelSagMm: 49.5,
  };
  return {
    fork: {
      ...part(160, 40, 84.36),
      warnings: [
        { code: 'temperature-offset', severity: 'info', message: 'Pumped indoors? Set a little more.' },
        { code: 'no-full-travel', severity: 'warning', message: 'A hard landing uses little travel.' },
      ],
    },
    shock,
    cautions: [
      'A starting point only: measure sag, then test-ride somewhere safe before riding hard.',
      'The maker’s manual and a qualified technician come first.',
    ],
    assumptions: [
      {
        key: 'fork.geometry.pistonDiameterMm',
        label: 'Air piston diameter (36 mm stanchions)',
        value: 32,
        unit: 'mm',
        source: 'estimate',
      },
      {
        key: 'rider.frontShare',
        label: "Share of the rider's weight on the front wheel",
        value: 0.42,
        source: 'estimate',
      },
      { key: 'constants.g0', label: 'Standard gravity', value: 9.80665, unit: 'm/s²', source: 'NIST SP 330' },
    ],
  };
}

/** The browser's back and forward buttons, for the memory router of these tests. */
function HistoryButtons() {
  const navigate = useNavigate();
  return (
    <>
      <button type="button" onClick={() => void navigate(-1)}>
        browser back
      </button>
      <button type="button" onClick={() => void navigate(1)}>
        browser forward
      </button>
    </>
  );
}

export function renderWizard(initialInput?: BaselineInput) {
  const user = userEvent.setup({ delay: null });
  const view = render(
    <AppTheme>
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        {/* history updates at once: in jsdom under act(), a transition could stay unrendered once the
            new step's heading takes the focus (the browser test covers the real router) */}
        <MemoryRouter useTransitions={false}>
          <BaselineWizardProvider initialInput={initialInput}>
            <BaselineWizard />
          </BaselineWizardProvider>
          <HistoryButtons />
        </MemoryRouter>
      </SWRConfig>
    </AppTheme>,
  );
  return { user, ...view };
}
