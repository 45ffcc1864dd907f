import type { BaselineInput, SagCheckInput, SagCheckResult } from '@loamline/shared-types';
import { screen, waitFor, within } from '@testing-library/react';
import type { UserEvent } from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api, ApiRequestError } from '@/lib/api-client';
import type * as ApiClient from '@/lib/api-client';
import { fakeResult, renderWizard } from '../testing/wizard-test-utils';

// The API client is faked in these component tests only; the browser test runs the real server.
vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof ApiClient>()),
  api: vi.fn(),
}));
const apiMock = vi.mocked(api);
// MUI and a whole wizard in jsdom: slower than the 5 s default on a busy machine
vi.setConfig({ testTimeout: 90_000 });

beforeEach(() => {
  window.localStorage.clear();
  apiMock.mockReset();
});
afterEach(() => vi.clearAllMocks());

const next = (user: UserEvent, name: RegExp | string = /^next$/i) =>
  user.click(screen.getByRole('button', { name }));

async function fillRider(user: UserEvent, weight = '82') {
  await user.type(screen.getByRole('textbox', { name: /weight with riding gear/i }), weight);
  await next(user);
}

async function fillRiding(user: UserEvent) {
  await screen.findByRole('heading', { name: 'How do you ride?' });
  await user.click(screen.getByRole('button', { name: /^Trail:/ }));
  await next(user);
}

async function fillBike(user: UserEvent) {
  await screen.findByRole('heading', { name: 'Your bike' });
  await user.type(screen.getByRole('textbox', { name: 'Fork travel' }), '160');
  await user.click(screen.getByRole('button', { name: '36 mm' }));
  await user.type(screen.getByRole('textbox', { name: 'Rear wheel travel' }), '165');
  await user.type(screen.getByRole('textbox', { name: 'Shock stroke' }), '65');
}

describe('baseline wizard: steps', () => {
  it('does not pass Rider with an empty or a negative weight, and passes with a real one', async () => {
    const { user } = renderWizard();
    expect(screen.getByText(/Step 1 of 5/)).toBeInTheDocument();
    await next(user);
    expect(await screen.findByText('Enter your weight with riding gear')).toBeInTheDocument();
    expect(screen.getByText(/Step 1 of 5/)).toBeInTheDocument();

    const weight = screen.getByRole('textbox', { name: /weight with riding gear/i });
    await user.type(weight, '-70');
    await next(user);
    expect(await screen.findByText('At least 20 kg')).toBeInTheDocument();
    expect(weight).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByText(/Step 1 of 5/)).toBeInTheDocument();

    await user.clear(weight);
    await user.type(weight, '82');
    await next(user);
    expect(await screen.findByRole('heading', { name: 'How do you ride?' })).toBeInTheDocument();
    expect(screen.getByText(/Step 2 of 5/)).toBeInTheDocument();
  });

  it('asks for a riding style before Bike, and for travel before the baseline', async () => {
    const { user } = renderWizard();
    await fillRider(user);
    await next(user);
    expect(await screen.findByText('Pick how you ride')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: /^Enduro:/ }));
    expect(screen.getByRole('button', { name: /^Enduro:/ })).toHaveAttribute('aria-pressed', 'true');
    // balanced is chosen until the rider picks another feel
    expect(screen.getByRole('button', { name: /^Balanced:/ })).toHaveAttribute('aria-pressed', 'true');
    await next(user);
    await screen.findByRole('heading', { name: 'Your bike' });
    await next(user, 'Get my baseline');
    expect(await screen.findByText('Enter the fork travel')).toBeInTheDocument();
    expect(screen.getByText('Pick the stanchion size')).toBeInTheDocument();
    expect(screen.getByText('Enter the rear wheel travel')).toBeInTheDocument();
    expect(screen.getByText('Enter the shock stroke')).toBeInTheDocument();
    expect(apiMock).not.toHaveBeenCalled();
  });

  it("follows the browser's back and forward buttons, checking the steps it moves forward over", async () => {
    const { user } = renderWizard();
    await fillRider(user, '82');
    await screen.findByRole('heading', { name: 'How do you ride?' });
    await user.click(screen.getByRole('button', { name: 'browser back' }));
    const weight = await screen.findByRole('textbox', { name: /weight with riding gear/i });
    expect(weight).toHaveValue('82');
    await user.click(screen.getByRole('button', { name: 'browser forward' }));
    expect(await screen.findByRole('heading', { name: 'How do you ride?' })).toBeInTheDocument();
    // back again, empty the weight: forward does not skip the check
    await user.click(screen.getByRole('button', { name: 'browser back' }));
    await user.clear(await screen.findByRole('textbox', { name: /weight with riding gear/i }));
    await user.click(screen.getByRole('button', { name: 'browser forward' }));
    expect(await screen.findByText('Enter your weight with riding gear')).toBeInTheDocument();
    expect(screen.getByText(/Step 1 of 5/)).toBeInTheDocument();
  });

  it('goes back a step with Back, keeping what was typed', async () => {
    const { user } = renderWizard();
    await fillRider(user, '77.5');
    await user.click(await screen.findByRole('button', { name: /^back$/i }));
    expect(screen.getByRole('textbox', { name: /weight with riding gear/i })).toHaveValue('77.5');
  });
});

describe('baseline wizard: the request', () => {
  it('sends the contract body built from the form, and shows the answer', async () => {
    const answer = fakeResult();
    if (answer.fork)
      answer.fork.endStroke = {
        psi: 180,
        bar: 12.41,
        given: true,
        recommendedPsi: 200,
        recommendedBar: 13.79,
        recommendedTravelUsedMm: 150,
        maxPsi: 300,
        maxIsDefault: true,
      };
    apiMock.mockResolvedValueOnce(answer);
    const { user } = renderWizard();
    await fillRider(user);
    await fillRiding(user);
    await fillBike(user);
    const forkCard = screen.getByRole('region', { name: 'Fork' });
    await user.click(within(forkCard).getByRole('button', { name: 'More: Volume spacers fitted' }));
    await user.click(screen.getByRole('button', { name: 'Yes, it has one' }));
    await user.type(await screen.findByRole('textbox', { name: 'End-stroke pressure' }), '180');
    await next(user, 'Get my baseline');

    await waitFor(() => expect(apiMock).toHaveBeenCalledTimes(1));
    const expected: BaselineInput = {
      rider: { massKg: 82 },
      riding: { style: 'trail', feel: 'balanced' },
      fork: { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 1, endStroke: { pressurePsi: 180 } },
      shock: { strokeMm: 65, wheelTravelMm: 165, spring: 'air', spacers: 0 },
    };
    expect(apiMock).toHaveBeenCalledWith('/baselines/compute', { method: 'POST', body: expected });

    // 84.36 psi → whole psi; 84.36 psi × 6894.757293168361 Pa/psi ÷ 100 000 Pa/bar = 5.816 bar (NIST SP 811)
    expect(await screen.findByTestId('fork-pressure')).toHaveTextContent('84 psi');
    const fork = screen.getByRole('region', { name: 'Fork' });
    expect(within(fork).getByText(/5\.8 bar/)).toBeInTheDocument();
    expect(within(fork).getByText(/range 80–89 psi/)).toBeInTheDocument();
    // the warning before the advice (severity order)
    const [warning, advice] = within(fork).getAllByRole('note');
    expect(warning).toHaveTextContent('A hard landing uses little travel.');
    expect(advice).toHaveTextContent('Pumped indoors? Set a little more.');
    expect(within(fork).getByText('40 mm')).toBeInTheDocument();
    const shock = screen.getByRole('region', { name: 'Rear shock' });
    expect(within(shock).getByTestId('shock-pressure')).toHaveTextContent('222 psi');
    expect(within(shock).getByText(/50 mm at the wheel/)).toBeInTheDocument();
    expect(within(fork).getByRole('figure', { name: /Fork: force against travel/ })).toBeInTheDocument();
    expect(within(fork).getByRole('table', { name: 'Travel used on a hard landing' })).toHaveTextContent(
      'End-stroke 200 psi',
    );
    expect(within(fork).getByText('Stiffness at sag')).toBeInTheDocument();
    // the cautions are on the page, not behind a click
    expect(screen.getByRole('heading', { name: 'Before you ride' })).toBeVisible();
    expect(screen.getByText(/A starting point only/)).toBeVisible();
    // at the pump: end-stroke chamber first, then the main chamber
    const pump = screen.getByRole('region', { name: 'At the pump' });
    expect(pump).toHaveTextContent(
      /End-stroke chamber first: set it to 180 psi \(the pressure you entered\).*never past its maximum of 300 psi.*Then the main chamber: pump to 84 psi/s,
    );
    // how it was worked out: closed, then what we assumed, in the rider's units, with a way to change it
    const assumed = screen.getByRole('region', { name: 'How this was worked out' });
    await user.click(within(assumed).getByRole('button', { name: /How this was worked out/ }));
    expect(within(assumed).getByText(/^32 mm/)).toBeInTheDocument();
    expect(within(assumed).getByText(/^42 %/)).toBeInTheDocument();
    await user.click(within(assumed).getByRole('button', { name: /Change: Air piston diameter/ }));
    // the Bike step's advanced panel, open, with the assumed value shown where the rider can override it
    const forkGeometry = await screen.findByRole('group', { name: 'Fork' });
    const piston = within(forkGeometry).getByRole('textbox', { name: 'Air piston diameter' });
    expect(piston).toHaveAttribute('placeholder', '32');
    await waitFor(() => expect(piston).toHaveFocus());
  });

  it('leaves blanks out and drops air settings for a coil shock and a bike without a fork', async () => {
    apiMock.mockResolvedValueOnce({ ...fakeResult(), fork: null });
    const { user } = renderWizard();
    await fillRider(user, '70');
    await fillRiding(user);
    await screen.findByRole('heading', { name: 'Your bike' });
    await user.click(screen.getByRole('button', { name: 'No fork' }));
    const rear = screen.getByRole('region', { name: 'Rear shock' });
    await user.click(within(rear).getByRole('button', { name: 'Coil' }));
    await user.type(screen.getByRole('textbox', { name: 'Rear wheel travel' }), '150');
    await user.type(screen.getByRole('textbox', { name: 'Shock stroke' }), '60');
    await next(user, 'Get my baseline');
    await waitFor(() => expect(apiMock).toHaveBeenCalledTimes(1));
    expect(apiMock.mock.calls[0][1]).toEqual({
      method: 'POST',
      body: {
        rider: { massKg: 70 },
        riding: { style: 'trail', feel: 'balanced' },
        fork: null,
        shock: { strokeMm: 60, wheelTravelMm: 150, spring: 'coil', spacers: 0 },
      },
    });
  });

  it("shows the server's error and puts a 400's field message under its input", async () => {
    apiMock.mockRejectedValueOnce(
      new ApiRequestError(400, {
        statusCode: 400,
        error: 'Bad Request',
        message: 'fork.spacers: the spacers would close the chamber before full travel',
        fields: { 'fork.spacers': 'the spacers would close the chamber before full travel' },
      }),
    );
    const { user } = renderWizard();
    await fillRider(user);
    await fillRiding(user);
    await fillBike(user);
    await next(user, 'Get my baseline');
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Loamline cannot work out a baseline from this');
    expect(alert).toHaveTextContent('fork.spacers: the spacers would close the chamber before full travel');
    await user.click(within(alert).getByRole('button', { name: 'Fix it' }));
    expect(await screen.findByRole('heading', { name: 'Your bike' })).toBeInTheDocument();
    expect(screen.getByText('The spacers would close the chamber before full travel')).toBeInTheDocument();
  });

  it('says so when the server cannot be reached', async () => {
    apiMock.mockRejectedValueOnce(new TypeError('Failed to fetch'));
    const { user } = renderWizard();
    await fillRider(user);
    await fillRiding(user);
    await fillBike(user);
    await next(user, 'Get my baseline');
    expect(await screen.findByRole('alert')).toHaveTextContent(/could not reach the server/);
  });
});

describe('baseline wizard: sag check', () => {
  it('sends the measured sag with the same input and says how much air to add', async () => {
    apiMock.mockResolvedValueOnce(fakeResult());
    const { user } = renderWizard();
    await fillRider(user);
    await fillRiding(user);
    await fillBike(user);
    await next(user, 'Get my baseline');
    await screen.findByTestId('fork-pressure');
    await next(user, 'Check my sag');

    await screen.findByRole('heading', { name: 'Sag check' });
    const pressure = screen.getByRole('textbox', { name: 'Pressure it was measured at' });
    expect(pressure).toHaveValue('84'); // prefilled with the baseline as the screen rounds it
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    expect(await screen.findByText('Enter the sag you measured')).toBeInTheDocument();

    apiMock.mockResolvedValueOnce({
      measuredSagPct: 27.5,
      targetSagPct: 25,
      targetSagMm: 40,
      newPressurePsi: 90.2,
      newPressureBar: 6.22,
      changePsi: 6.2,
      maxPsi: 150,
      maxIsDefault: true,
      minPsi: 30,
      warnings: [],
    } satisfies SagCheckResult);
    await user.type(screen.getByRole('textbox', { name: 'Sag measured on the stanchion' }), '44');
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    expect(await screen.findByTestId('sag-advice')).toHaveTextContent('Add 6 psi');
    expect(screen.getByText(/New pressure/)).toHaveTextContent('New pressure: 90 psi');

    const body = apiMock.mock.calls[1][1]?.body as unknown as SagCheckInput;
    expect(apiMock.mock.calls[1][0]).toBe('/baselines/sag-check');
    expect(body.measured).toEqual({ part: 'fork', pressurePsi: 84, sagMm: 44 });
    expect(body.rider).toEqual({ massKg: 82 });
    expect(body.fork?.travelMm).toBe(160);

    // the rear shock, with "let out"
    apiMock.mockResolvedValueOnce({
      measuredSagPct: 36,
      targetSagPct: 30,
      targetSagMm: 19.5,
      newPressurePsi: 210,
      newPressureBar: 14.48,
      changePsi: -12,
      maxPsi: 350,
      maxIsDefault: false,
      minPsi: 50,
      warnings: [],
    } satisfies SagCheckResult);
    await user.click(screen.getByRole('button', { name: 'Rear shock' }));
    expect(screen.getByRole('textbox', { name: 'Pressure it was measured at' })).toHaveValue('222');
    await user.type(screen.getByRole('textbox', { name: 'Sag measured on the shock shaft' }), '23.4');
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    expect(await screen.findByTestId('sag-advice')).toHaveTextContent('Let out 12 psi');
    expect(screen.getByText(/Never past 350 psi \(your maximum\)/)).toBeInTheDocument();
    // done: save, print or back to the baseline
    const done = screen.getByRole('region', { name: 'Done?' });
    expect(within(done).getByRole('button', { name: 'Print baseline sheet' })).toBeInTheDocument();
    await user.click(within(done).getByRole('button', { name: 'Back to the baseline' }));
    expect(await screen.findByRole('heading', { name: 'Your baseline' })).toBeInTheDocument();
  });

  async function toSagCheck(user: UserEvent) {
    apiMock.mockResolvedValueOnce(fakeResult());
    await fillRider(user);
    await fillRiding(user);
    await fillBike(user);
    await next(user, 'Get my baseline');
    await screen.findByTestId('fork-pressure');
    await next(user, 'Check my sag');
    await screen.findByRole('heading', { name: 'Sag check' });
    await user.click(screen.getByRole('button', { name: 'Rear shock' }));
  }

  it('puts an above-maximum answer first as a blocking error, before any number', async () => {
    const { user } = renderWizard();
    await toSagCheck(user);
    const pressure = screen.getByRole('textbox', { name: 'Pressure it was measured at' });
    await user.clear(pressure);
    await user.type(pressure, '280');
    await user.type(screen.getByRole('textbox', { name: 'Sag measured on the shock shaft' }), '29');
    // the shape the contract gives (shared-types SagCheckResult); the numbers are made up
    apiMock.mockResolvedValueOnce({
      measuredSagPct: 44.6,
      targetSagPct: 30,
      targetSagMm: 19.5,
      newPressurePsi: 417,
      newPressureBar: 28.75,
      changePsi: 137,
      maxPsi: 350,
      maxIsDefault: true,
      minPsi: 50,
      warnings: [
        { code: 'sag-info', severity: 'info', message: 'Measure twice.' },
        {
          code: 'above-max-pressure',
          severity: 'error',
          message: 'The target sag needs too much air.',
        },
      ],
    } satisfies SagCheckResult);
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    const answer = await screen.findByTestId('sag-answer');
    const alert = within(answer).getByRole('alert');
    expect(alert).toHaveTextContent("Don't pump past 350 psi");
    expect(alert).toHaveTextContent(/the shock is 350 psi \(Loamline's default/);
    const number = within(answer).getByTestId('sag-worked-out');
    expect(number).toHaveTextContent('Worked out: 417 psi, past the 350 psi maximum. Do not set it.');
    expect(alert.compareDocumentPosition(number) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
    // no instruction to add air
    expect(screen.queryByTestId('sag-advice')).not.toBeInTheDocument();
    expect(answer).not.toHaveTextContent(/Add 137/);
  });

  it('takes the answer away as soon as the measurement changes, until the rider checks again', async () => {
    const { user } = renderWizard();
    await toSagCheck(user);
    const sag = screen.getByRole('textbox', { name: 'Sag measured on the shock shaft' });
    const pressure = screen.getByRole('textbox', { name: 'Pressure it was measured at' });
    await user.type(sag, '23.4');
    const answer = {
      measuredSagPct: 36,
      targetSagPct: 30,
      targetSagMm: 19.5,
      newPressurePsi: 210,
      newPressureBar: 14.48,
      changePsi: -12,
      maxPsi: 350,
      maxIsDefault: false,
      minPsi: 50,
      warnings: [],
    } satisfies SagCheckResult;
    apiMock.mockResolvedValueOnce(answer);
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    expect(await screen.findByTestId('sag-advice')).toHaveTextContent('Let out 12 psi');

    // another sag: the old advice is not about it
    await user.clear(sag);
    await user.type(sag, '15');
    expect(screen.queryByTestId('sag-answer')).not.toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Done?' })).not.toBeInTheDocument();

    apiMock.mockResolvedValueOnce({ ...answer, changePsi: 8, newPressurePsi: 230 });
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    expect(await screen.findByTestId('sag-advice')).toHaveTextContent('Add 8 psi');

    // another pressure: the same
    await user.clear(pressure);
    await user.type(pressure, '200');
    expect(screen.queryByTestId('sag-answer')).not.toBeInTheDocument();
  });

  it('refuses a gauge reading past any maximum without calling it a range', async () => {
    const { user } = renderWizard();
    await toSagCheck(user);
    await user.type(screen.getByRole('textbox', { name: 'Sag measured on the shock shaft' }), '20');
    const pressure = screen.getByRole('textbox', { name: 'Pressure it was measured at' });
    await user.clear(pressure);
    await user.type(pressure, '1200');
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    expect(
      await screen.findByText(
        'More than any shock holds; the maximum is 350 psi. Check the gauge reading and its unit (psi or bar).',
      ),
    ).toBeInTheDocument();
    expect(screen.queryByText(/1,000 psi/)).not.toBeInTheDocument();
    expect(apiMock).toHaveBeenCalledTimes(1); // the baseline only: nothing was sent
  });

  it('shows a refused measurement on its field', async () => {
    const { user } = renderWizard();
    await toSagCheck(user);
    await user.type(screen.getByRole('textbox', { name: 'Sag measured on the shock shaft' }), '60');
    apiMock.mockRejectedValueOnce(
      new ApiRequestError(400, {
        statusCode: 400,
        error: 'Bad Request',
        message: 'measured.sagMm: not plausible for this shock',
        fields: { 'measured.sagMm': 'not plausible for this shock (stroke 65 mm)' },
      }),
    );
    await user.click(screen.getByRole('button', { name: /check my sag/i }));
    const field = screen.getByRole('textbox', { name: 'Sag measured on the shock shaft' });
    await waitFor(() => expect(field).toHaveAttribute('aria-invalid', 'true'));
    expect(screen.getByText('Not plausible for this shock (stroke 65 mm)')).toBeInTheDocument();
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });
});
