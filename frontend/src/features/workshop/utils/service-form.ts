import type { ShopService } from '@loamline/shared-types';
import { z } from '@/lib/zod';
import type { ServiceBody } from '../api/services';
import { toMajorInput, toMinor } from './money';

/*
 * zod/mini carries no locale, so a check without a message would read "Invalid input": the length
 * limits spell out the words zod's English locale gave them before.
 */
const tooLong = (max: number) => z.maxLength(max, `Too big: expected string to have <=${max} characters`);

const minutesText = z.string().check(z.trim(), z.regex(/^\d+$/, 'Minutes, a whole number'));

/** A service as the owner types it: minutes and money as text, money in major units. */
export const serviceFormSchema = (currency: string) =>
  z
    .object({
      name: z.string().check(z.trim(), z.minLength(1, 'Give the service a name'), tooLong(120)),
      description: z.string().check(tooLong(1000)),
      durationMinutes: minutesText.check(
        z.refine((v) => Number(v) >= 5 && Number(v) <= 600, '5 to 600 minutes'),
        z.refine((v) => Number(v) % 5 === 0, 'On the 5-minute grid'),
      ),
      bufferAfterMinutes: minutesText.check(
        z.refine((v) => Number(v) <= 240, 'At most 240 minutes'),
        z.refine((v) => Number(v) % 5 === 0, 'On the 5-minute grid'),
      ),
      price: z
        .string()
        .check(z.refine((v) => toMinor(v, currency) !== null, `An amount in ${currency}, e.g. 89.00`)),
      deposit: z
        .string()
        .check(z.refine((v) => toMinor(v, currency) !== null, `An amount in ${currency}, or 0`)),
      active: z.boolean(),
    })
    .check(
      z.superRefine((v, ctx) => {
        const price = toMinor(v.price, currency);
        const deposit = toMinor(v.deposit, currency);
        if (price !== null && deposit !== null && deposit > price)
          ctx.addIssue({ code: 'custom', path: ['deposit'], message: 'At most the price' });
      }),
    );

export type ServiceFormValues = z.infer<ReturnType<typeof serviceFormSchema>>;

export const emptyServiceForm: ServiceFormValues = {
  name: '',
  description: '',
  durationMinutes: '60',
  bufferAfterMinutes: '15',
  price: '',
  deposit: '0',
  active: true,
};

export function serviceToForm(s: ShopService, currency: string): ServiceFormValues {
  return {
    name: s.name,
    description: s.description,
    durationMinutes: String(s.durationMinutes),
    bufferAfterMinutes: String(s.bufferAfterMinutes),
    price: toMajorInput(s.priceMinor, currency),
    deposit: toMajorInput(s.depositMinor, currency),
    active: s.active,
  };
}

/** The body for POST/PATCH: minutes as numbers, money in minor units. */
export function formToService(v: ServiceFormValues, currency: string): ServiceBody {
  return {
    name: v.name.trim(),
    description: v.description.trim(),
    durationMinutes: Number(v.durationMinutes),
    bufferAfterMinutes: Number(v.bufferAfterMinutes),
    priceMinor: toMinor(v.price, currency) ?? 0,
    depositMinor: toMinor(v.deposit, currency) ?? 0,
    active: v.active,
  };
}

/** Server field names (`priceMinor`) → the inputs here (`price`). */
export const SERVICE_FIELD: Record<string, keyof ServiceFormValues> = {
  name: 'name',
  description: 'description',
  durationMinutes: 'durationMinutes',
  bufferAfterMinutes: 'bufferAfterMinutes',
  priceMinor: 'price',
  depositMinor: 'deposit',
  active: 'active',
};
