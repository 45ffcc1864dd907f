import type { BaselineInput } from '@loamline/shared-types';
import { screen, waitFor, within } from '@testing-library/react';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { api } from '@/lib/api-client';
import type * as ApiClient from '@/lib/api-client';
import {
  barToPsi,
  cToF,
  cm3ToIn3,
  fToC,
  formatQuantity,
  ftToM,
  in3ToCm3,
  mToFt,
  quantityOfApiUnit,
  unitPrefs,
  fromDisplay,
  inToMm,
  kgToLb,
  lbToKg,
  mmToIn,
  nPerMmToLbPerIn,
  parseDecimal,
  psiToBar,
  toDisplay,
} from '@/lib/units';
import { UNITS_STORAGE_KEY } from './hooks/use-unit-prefs';
import { fakeResult, renderWizard } from './testing/wizard-test-utils';

// Reference factors, NIST SP 811 (2008), Appendix B.8, all exact by definition:
const LB_KG = 0.45359237; // pound (avoirdupois) → kilogram
const PSI_PA = 6894.757293168361; // pound-force per square inch → pascal (4.4482216152605 N / 0.0254² m²)
const BAR_PA = 1e5; // bar → pascal
const IN_MM = 25.4; // inch → millimetre
const LBF_N = 4.4482216152605; // pound-force → newton
const IN3_CM3 = 16.387064; // cubic inch → cubic centimetre (1.638 706 4 E−05 m³ = 2.54³ cm³)
const FT_M = 0.3048; // foot → metre
// degree Fahrenheit → degree Celsius: t/°C = (t/°F − 32) / 1.8 (NIST SP 811, App. B.8 and sec. 4.2.1.1)

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof ApiClient>()),
  api: vi.fn(),
}));
const apiMock = vi.mocked(api);
vi.setConfig({ testTimeout: 90_000 });

beforeEach(() => {
  window.localStorage.clear();
  window.sessionStorage.clear();
  apiMock.mockReset();
});

describe('lib/units against NIST SP 811', () => {
  it('converts mass, pressure and length both ways', () => {
    expect(lbToKg(1)).toBe(LB_KG);
    expect(kgToLb(LB_KG)).toBeCloseTo(1, 15);
    expect(kgToLb(82)).toBeCloseTo(82 / LB_KG, 12); // 180.779… lb
    expect(psiToBar(1)).toBeCloseTo(PSI_PA / BAR_PA, 15); // 0.068 947 57… bar
    expect(barToPsi(1)).toBeCloseTo(BAR_PA / PSI_PA, 12); // 14.503 77… psi
    expect(barToPsi(psiToBar(87.3))).toBeCloseTo(87.3, 12);
    expect(inToMm(1)).toBe(IN_MM);
    expect(mmToIn(160)).toBeCloseTo(160 / IN_MM, 12); // 6.299… in
    // a spring rate: 1 lbf/in = 4.4482216152605 N / 25.4 mm
    expect(nPerMmToLbPerIn(LBF_N / IN_MM)).toBeCloseTo(1, 12);
  });

  it('converts volume, altitude and temperature both ways', () => {
    expect(in3ToCm3(1)).toBe(IN3_CM3); // NIST SP 811, App. B.8: cubic inch, exact
    expect(IN3_CM3).toBeCloseTo(IN_MM ** 3 / 1000, 12); // the same factor from the inch: 2.54³ cm³
    expect(cm3ToIn3(10)).toBeCloseTo(10 / IN3_CM3, 12); // a spacer of 10 cm³ → 0.610 in³
    expect(ftToM(1)).toBe(FT_M); // NIST SP 811, App. B.8: foot, exact
    expect(mToFt(1000)).toBeCloseTo(1000 / FT_M, 9); // 3280.84 ft
    // NIST SP 811, App. B.8 (degree Fahrenheit): water freezes at 32 °F, boils at 212 °F; −40 is both
    expect(cToF(0)).toBe(32);
    expect(cToF(100)).toBeCloseTo(212, 12);
    expect(cToF(-40)).toBeCloseTo(-40, 12);
    expect(fToC(68)).toBeCloseTo(20, 12);
    expect(fToC(cToF(17.3))).toBeCloseTo(17.3, 12);
  });

  it('has one metric/imperial choice for every quantity but pressure, which is chosen on its own', () => {
    expect(unitPrefs('imperial', 'psi')).toEqual({
      system: 'imperial',
      pressure: 'psi',
      mass: 'lb',
      length: 'in',
      volume: 'in³',
      altitude: 'ft',
      temperature: '°F',
    });
    expect(unitPrefs('metric', 'bar')).toMatchObject({
      mass: 'kg',
      length: 'mm',
      volume: 'cm³',
      altitude: 'm',
    });
    const imperial = unitPrefs('imperial', 'psi');
    expect(formatQuantity('volume', 10, imperial)).toBe('0.61 in³'); // 10 / 16.387064
    expect(formatQuantity('altitude', 1200, imperial)).toBe('3,937 ft'); // 1200 / 0.3048 = 3937.0
    expect(formatQuantity('temperature', 20, imperial)).toBe('68 °F'); // 20 × 1.8 + 32
    expect(fromDisplay('temperature', 50, imperial)).toBeCloseTo(10, 12); // (50 − 32) / 1.8
    expect(fromDisplay('volume', 1, imperial)).toBe(IN3_CM3);
    expect(fromDisplay('altitude', 1000, imperial)).toBeCloseTo(304.8, 12);
    // the server's units name the quantity they are
    expect(['kg', 'psi', 'mm', 'cm³', 'm', '°C', 'N'].map(quantityOfApiUnit)).toEqual([
      'mass',
      'pressure',
      'length',
      'volume',
      'altitude',
      'temperature',
      undefined,
    ]);
  });

  it('goes to and from the rider’s units and formats what a pump or a tape reads', () => {
    const imperial = unitPrefs('imperial', 'bar');
    expect(toDisplay('mass', 82, imperial)).toBeCloseTo(82 / LB_KG, 12);
    expect(fromDisplay('pressure', 6, imperial)).toBeCloseTo((6 * BAR_PA) / PSI_PA, 12);
    expect(fromDisplay('length', 2.5, imperial)).toBeCloseTo(2.5 * IN_MM, 12);
    // 84.36 psi × 6894.757 Pa/psi ÷ 1e5 Pa/bar = 5.816 bar → 5.8 bar; 160 mm → 6.30 in; 82 kg → 180.8 lb
    expect(formatQuantity('pressure', 84.36, imperial)).toBe('5.8 bar');
    expect(formatQuantity('length', 160, imperial)).toBe('6.30 in');
    expect(formatQuantity('mass', 82, imperial)).toBe('180.8 lb');
    expect(formatQuantity('pressure', 84.36, unitPrefs('metric', 'psi'))).toBe('84 psi');
  });

  it('reads a decimal comma, and nothing else that is not a number', () => {
    expect(parseDecimal('5,8')).toBe(5.8);
    expect(parseDecimal(' 82 ')).toBe(82);
    expect(parseDecimal('')).toBeNaN();
    expect(parseDecimal('8o')).toBeNaN();
    expect(parseDecimal('1e3')).toBeNaN();
  });
});

describe('the wizard in the rider’s units', () => {
  it('sends kg, psi and mm whatever the rider typed in lb, bar and in', async () => {
    apiMock.mockResolvedValueOnce(fakeResult());
    window.localStorage.setItem(UNITS_STORAGE_KEY, JSON.stringify({ system: 'imperial', pressure: 'bar' }));
    const { user } = renderWizard();
    await user.type(screen.getByRole('textbox', { name: /weight with riding gear/i }), '180');
    await user.click(screen.getByRole('button', { name: /^next$/i }));
    await user.click(await screen.findByRole('button', { name: /^Trail:/ }));
    await user.click(screen.getByRole('button', { name: /^next$/i }));
    await user.type(await screen.findByRole('textbox', { name: 'Fork travel' }), '6.3');
    await user.click(screen.getByRole('button', { name: '36 mm' }));
    await user.click(screen.getByRole('button', { name: 'Yes, it has one' }));
    await user.type(await screen.findByRole('textbox', { name: 'End-stroke pressure' }), '12,4');
    await user.type(screen.getByRole('textbox', { name: 'Rear wheel travel' }), '6.5');
    await user.type(screen.getByRole('textbox', { name: 'Shock stroke' }), '2.5');
    await user.click(screen.getByRole('button', { name: 'Get my baseline' }));

    await waitFor(() => expect(apiMock).toHaveBeenCalledTimes(1));
    const body = apiMock.mock.calls[0][1]?.body as unknown as BaselineInput;
    expect(body.rider.massKg).toBeCloseTo(180 * LB_KG, 9); // 81.646 627 kg
    expect(body.fork?.travelMm).toBeCloseTo(6.3 * IN_MM, 9); // 160.02 mm
    expect(body.fork?.endStroke?.pressurePsi).toBeCloseTo((12.4 * BAR_PA) / PSI_PA, 9); // 179.84 psi
    expect(body.shock?.wheelTravelMm).toBeCloseTo(6.5 * IN_MM, 9); // 165.1 mm
    expect(body.shock?.strokeMm).toBeCloseTo(2.5 * IN_MM, 9); // 63.5 mm

    // the answer in the same units: 84.36 psi → 5.8 bar (range 79.96–88.96 psi → 5.5–6.1 bar); 40 mm → 1.57 in
    expect(await screen.findByTestId('fork-pressure')).toHaveTextContent('5.8 bar');
    const fork = screen.getByRole('region', { name: 'Fork' });
    expect(within(fork).getByText(/range 5\.5–6\.1 bar/)).toBeInTheDocument();
    expect(within(fork).getByText('1.57 in')).toBeInTheDocument();
    expect(within(fork).getByText(/^84 psi/)).toBeInTheDocument();
  });

  it('converts what is on screen when the rider switches units, and remembers the choice', async () => {
    const { user, unmount } = renderWizard();
    const weight = screen.getByRole('textbox', { name: /weight with riding gear/i });
    await user.type(weight, '82');
    await user.click(screen.getByRole('button', { name: 'lb' }));
    expect(weight).toHaveValue('180.8'); // 82 kg ÷ 0.45359237 kg/lb = 180.779 lb
    await user.click(screen.getByRole('button', { name: 'kg' }));
    expect(weight).toHaveValue('82'); // the stored value is unchanged, not rounded twice
    await user.click(screen.getByRole('button', { name: 'lb' }));
    expect(JSON.parse(window.localStorage.getItem(UNITS_STORAGE_KEY) ?? '{}')).toEqual({
      system: 'imperial',
      pressure: 'psi',
    });
    unmount();

    // a new visit in this browser: still imperial; the wizard's units control says so, and this
    // tab's input is still there
    renderWizard();
    expect(screen.getByRole('button', { name: 'Units: imperial, psi' })).toBeInTheDocument();
    expect(screen.getByRole('textbox', { name: /weight with riding gear/i })).toHaveValue('180.8');
  });

  it('reads a choice kept before the metric/imperial switch (lb or in was imperial)', () => {
    window.localStorage.setItem(
      UNITS_STORAGE_KEY,
      JSON.stringify({ mass: 'kg', pressure: 'bar', length: 'in' }),
    );
    renderWizard();
    expect(screen.getByRole('button', { name: 'Units: imperial, bar' })).toBeInTheDocument();
  });

  it('switches metric/imperial and pressure in the units control', async () => {
    const { user } = renderWizard();
    await user.click(screen.getByRole('button', { name: /^Units:/ }));
    const dialog = await screen.findByRole('dialog', { name: 'Units' });
    await user.click(within(dialog).getByRole('button', { name: 'bar' }));
    await user.click(within(dialog).getByRole('button', { name: /^Imperial: lb, in, in³, ft, °F$/ }));
    await user.keyboard('{Escape}');
    expect(screen.getByRole('button', { name: 'Units: imperial, bar' })).toBeInTheDocument();
  });

  it('shows altitude in ft and temperature in °F, and sends m and °C', async () => {
    apiMock.mockResolvedValueOnce(fakeResult());
    window.localStorage.setItem(UNITS_STORAGE_KEY, JSON.stringify({ system: 'imperial', pressure: 'psi' }));
    const { user } = renderWizard({
      rider: { massKg: 82 },
      riding: { style: 'trail', feel: 'balanced' },
      fork: { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 1 },
      shock: null,
    });
    await user.click(screen.getByRole('button', { name: /^next$/i }));
    await user.click(await screen.findByRole('button', { name: /^next$/i }));
    await screen.findByRole('heading', { name: 'Your bike' });
    await user.click(screen.getByRole('button', { name: /^advanced/i }));
    const altitude = await screen.findByRole('textbox', { name: /altitude where you ride/i });
    const temperature = screen.getByRole('textbox', { name: /air temperature where you pump and ride/i });
    expect(altitude.parentElement).toHaveTextContent('ft');
    expect(temperature.parentElement).toHaveTextContent('°F');
    await user.type(altitude, '3281'); // 3281 ft × 0.3048 m/ft = 1000.05 m
    await user.type(temperature, '50'); // (50 − 32) / 1.8 = 10 °C
    await user.click(screen.getByRole('button', { name: 'Get my baseline' }));
    await waitFor(() => expect(apiMock).toHaveBeenCalledTimes(1));
    const body = apiMock.mock.calls[0][1]?.body as unknown as BaselineInput;
    expect(body.conditions?.altitudeM).toBeCloseTo(3281 * FT_M, 9);
    expect(body.conditions?.temperatureC).toBeCloseTo(10, 9);
  });
});
