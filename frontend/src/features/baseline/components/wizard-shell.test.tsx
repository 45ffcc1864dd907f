import { render, screen, waitFor } from '@testing-library/react';
import userEvent, { type UserEvent } from '@testing-library/user-event';
import { MemoryRouter } from 'react-router';
import { SWRConfig } from 'swr';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api } from '@/lib/api-client';
import type * as ApiClient from '@/lib/api-client';
import { AppTheme } from '@/theme/app-theme';
import { useBaselineWizard, BaselineWizardProvider } from '../hooks/use-baseline-wizard';
import { fakeResult, renderWizard } from '../testing/wizard-test-utils';
import { DRAFT_KEY } from '../utils/draft';
import { BaselineWizard } from './baseline-wizard';

/*
 * The wizard's shell: what a reload keeps, when a result is shown, focus, Enter and errors. The API
 * client is faked; the browser test (e2e/baseline-shell.e2e.ts) runs the same against the server.
 */
vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof ApiClient>()),
  api: vi.fn(),
}));
const apiMock = vi.mocked(api);
vi.setConfig({ testTimeout: 90_000 });

beforeEach(() => {
  window.localStorage.clear();
  apiMock.mockReset();
});
afterEach(() => vi.clearAllMocks());

const next = (user: UserEvent, name: RegExp | string = /^next$/i) =>
  user.click(screen.getByRole('button', { name }));

async function toBike(user: UserEvent) {
  await user.type(screen.getByRole('textbox', { name: /weight with riding gear/i }), '82');
  await next(user);
  await user.click(await screen.findByRole('button', { name: /^Trail:/ }));
  await next(user);
  await screen.findByRole('heading', { name: 'Your bike' });
}

async function fillBike(user: UserEvent) {
  await user.type(screen.getByRole('textbox', { name: 'Fork travel' }), '160');
  await user.click(screen.getByRole('button', { name: '36 mm' }));
  await user.type(screen.getByRole('textbox', { name: 'Rear wheel travel' }), '165');
  await user.type(screen.getByRole('textbox', { name: 'Shock stroke' }), '65');
}

/** What the wizard hands the Baseline step, for the checks on when a result is shown. */
function ResultProbe() {
  const { result, request } = useBaselineWizard();
  return (
    <output aria-label="probe">
      {result && request ? `result for ${request.fork?.travelMm} mm` : 'none'}
    </output>
  );
}

function renderWithProbe() {
  const user = userEvent.setup({ delay: null });
  render(
    <AppTheme>
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <MemoryRouter useTransitions={false}>
          <BaselineWizardProvider>
            <BaselineWizard />
            <ResultProbe />
          </BaselineWizardProvider>
        </MemoryRouter>
      </SWRConfig>
    </AppTheme>,
  );
  return { user };
}

describe('the wizard keeps the rider’s input and step for this tab', () => {
  it('a reload on the Bike step comes back on the Bike step with every value', async () => {
    const first = renderWizard();
    await toBike(first.user);
    await first.user.type(screen.getByRole('textbox', { name: 'Fork travel' }), '160');
    await first.user.click(screen.getByRole('button', { name: '36 mm' }));
    first.unmount();

    const { user } = renderWizard();
    expect(await screen.findByRole('heading', { name: 'Your bike' })).toBeInTheDocument();
    expect(screen.getByRole('textbox', { name: 'Fork travel' })).toHaveValue('160');
    expect(screen.getByRole('button', { name: '36 mm' })).toHaveAttribute('aria-pressed', 'true');
    await user.click(screen.getByRole('button', { name: /^back$/i }));
    expect(await screen.findByRole('button', { name: /^Trail:/ })).toHaveAttribute('aria-pressed', 'true');
    await user.click(screen.getByRole('button', { name: /^back$/i }));
    expect(await screen.findByRole('textbox', { name: /weight with riding gear/i })).toHaveValue('82');
  });

  it('a reload on the Baseline step works the same baseline out again', async () => {
    apiMock.mockResolvedValue(fakeResult());
    const first = renderWizard();
    await toBike(first.user);
    await fillBike(first.user);
    await next(first.user, 'Get my baseline');
    await screen.findByTestId('fork-pressure');
    first.unmount();

    renderWizard();
    expect(await screen.findByTestId('fork-pressure')).toHaveTextContent('84 psi');
    expect(apiMock).toHaveBeenCalledTimes(2);
    expect(apiMock.mock.calls[1]).toEqual(apiMock.mock.calls[0]);
  });

  it('a kept draft that no longer passes goes back to the step that needs fixing', async () => {
    window.sessionStorage.setItem(
      DRAFT_KEY,
      JSON.stringify({ step: 3, values: { rider: { massKg: null }, riding: { style: 'trail' } } }),
    );
    renderWizard();
    expect(await screen.findByRole('heading', { name: /how much do you weigh/i })).toBeInTheDocument();
    expect(apiMock).not.toHaveBeenCalled();
  });

  it('a garbled draft is ignored', () => {
    window.sessionStorage.setItem(DRAFT_KEY, '{not json');
    renderWizard();
    expect(screen.getByRole('textbox', { name: /weight with riding gear/i })).toHaveValue('');
  });

  it('Start over clears the input and the kept draft, after asking', async () => {
    const { user } = renderWizard();
    await toBike(user);
    await user.click(screen.getByRole('button', { name: 'Start over' }));
    await user.click(await screen.findByRole('button', { name: 'Keep my input' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(screen.getByRole('heading', { name: 'Your bike' })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Start over' }));
    const dialog = await screen.findByRole('dialog', { name: 'Start over?' });
    await user.click(dialog.querySelector('button.MuiButton-contained') as HTMLElement);
    expect(await screen.findByRole('textbox', { name: /weight with riding gear/i })).toHaveValue('');
    const kept = JSON.parse(window.sessionStorage.getItem(DRAFT_KEY) ?? '{}') as { step?: number };
    expect(kept.step).toBe(0);
  });
});

describe('a result is shown only for the exact input it was worked out for', () => {
  it('goes when an input changes, and comes back with the next Get my baseline', async () => {
    apiMock.mockImplementation((_path, init) =>
      Promise.resolve({
        ...fakeResult(),
        fork: {
          ...fakeResult().fork!,
          travelMm: (init?.body as { fork: { travelMm: number } }).fork.travelMm,
        },
      }),
    );
    const { user } = renderWithProbe();
    await toBike(user);
    await fillBike(user);
    await next(user, 'Get my baseline');
    await screen.findByTestId('fork-pressure');
    expect(screen.getByLabelText('probe')).toHaveTextContent('result for 160 mm');

    await user.click(screen.getByRole('button', { name: /^back$/i }));
    const travel = await screen.findByRole('textbox', { name: 'Fork travel' });
    await user.clear(travel);
    expect(screen.getByLabelText('probe')).toHaveTextContent('none'); // blank: invalid, no result
    await user.type(travel, '150');
    expect(screen.getByLabelText('probe')).toHaveTextContent('none'); // another input: not that result
    await user.clear(travel);
    await user.type(travel, '160');
    expect(screen.getByLabelText('probe')).toHaveTextContent('result for 160 mm'); // the same input again
    await user.clear(travel);
    await user.type(travel, '150');
    await next(user, 'Get my baseline');
    await waitFor(() => expect(screen.getByLabelText('probe')).toHaveTextContent('result for 150 mm'));
  });
});

describe('keyboard and screen reader', () => {
  it('Enter in a field does what Next does, and the new step’s heading takes the focus', async () => {
    const { user } = renderWizard();
    const weight = screen.getByRole('textbox', { name: /weight with riding gear/i });
    await user.type(weight, '82{Enter}');
    const heading = await screen.findByRole('heading', { name: 'How do you ride?' });
    await waitFor(() => expect(heading).toHaveFocus());
    expect(heading).toHaveAttribute('tabindex', '-1');
  });

  it('Enter with a mistake stays and says what is wrong', async () => {
    const { user } = renderWizard();
    await user.type(screen.getByRole('textbox', { name: /weight with riding gear/i }), '5{Enter}');
    expect(await screen.findByText('At least 20 kg')).toBeInTheDocument();
    expect(screen.getByText(/Step 1 of 5/)).toBeInTheDocument();
  });

  it('no error before the rider typed in or left a field', async () => {
    const { user } = renderWizard();
    await toBike(user);
    const travel = screen.getByRole('textbox', { name: 'Fork travel' });
    await user.click(travel);
    await user.tab(); // into a field and out again, nothing typed: no error yet
    expect(screen.queryByText('Enter the fork travel')).not.toBeInTheDocument();
    await user.type(travel, '9');
    expect(screen.queryByText('At least 40 mm')).not.toBeInTheDocument(); // still typing
    await user.tab();
    expect(await screen.findByText('At least 40 mm')).toBeInTheDocument(); // left it: now it says
  });
});
