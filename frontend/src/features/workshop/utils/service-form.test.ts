import { describe, expect, it } from 'vitest';
import { emptyServiceForm, formToService, serviceFormSchema, serviceToForm } from './service-form';

describe('service form', () => {
  it('sends money in minor units and reads it back in major units', () => {
    const body = formToService(
      { ...emptyServiceForm, name: ' Fork air setup ', price: '89.5', deposit: '20' },
      'EUR',
    );
    expect(body).toEqual({
      name: 'Fork air setup',
      description: '',
      durationMinutes: 60,
      bufferAfterMinutes: 15,
      priceMinor: 8950,
      depositMinor: 2000,
      active: true,
    });
    expect(serviceToForm({ id: 's', ...body, checklist: null }, 'EUR')).toMatchObject({
      price: '89.50',
      deposit: '20.00',
    });
  });

  it('allows a free service and refuses a deposit above the price', () => {
    const schema = serviceFormSchema('USD');
    expect(
      schema.safeParse({ ...emptyServiceForm, name: 'Sag check', price: '0', deposit: '0' }).success,
    ).toBe(true);
    const r = schema.safeParse({ ...emptyServiceForm, name: 'Setup', price: '50', deposit: '60' });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join('.'))).toEqual(['deposit']);
    const odd = schema.safeParse({
      ...emptyServiceForm,
      name: 'Setup',
      price: '1.234',
      durationMinutes: '62',
    });
    expect(odd.error!.issues.map((i) => i.path.join('.')).sort()).toEqual(['durationMinutes', 'price']);
  });
});
