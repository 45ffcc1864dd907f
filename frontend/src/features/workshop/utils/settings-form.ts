import type { ShopSettings } from '@loamline/shared-types';
import { z } from '@/lib/zod';
import { toMinutes } from './time';

/**
 * Hours & rules as the form holds them: the week as seven days, each with its opening intervals;
 * numbers as the text the owner typed. `settingsToForm` and `formToSettings` go between this and
 * the body of `PUT /api/workshop/settings`, and `formPathOfField` puts a server `fields` name
 * (`hours.2`, `closures.0.to`) on the input it means.
 */

const TIME = /^(?:[01]\d|2[0-3]):[0-5]\d$|^24:00$/;
const DATE = /^\d{4}-\d{2}-\d{2}$/;

const intText = (label: string, min: number, max: number) =>
  z.string().check(
    z.trim(),
    z.regex(/^\d+$/, `${label}: a whole number`),
    z.refine((v) => Number(v) >= min && Number(v) <= max, `${label}: ${min} to ${max}`),
  );

const interval = z
  .object({
    start: z.string().check(z.regex(TIME, 'A time like 09:00')),
    end: z.string().check(z.regex(TIME, 'A time like 17:30')),
  })
  .check(
    z.superRefine((v, ctx) => {
      if (TIME.test(v.start) && TIME.test(v.end) && toMinutes(v.end) <= toMinutes(v.start))
        ctx.addIssue({ code: 'custom', path: ['end'], message: 'Closes after it opens' });
    }),
  );

export const settingsFormSchema = z.object({
  timeZone: z.string().check(z.minLength(1, 'Choose the shop’s time zone')),
  currency: z.string().check(z.regex(/^[A-Z]{3}$/, 'A three-letter code like EUR')),
  benches: intText('Benches', 1, 20),
  days: z
    .array(
      z.object({
        weekday: z.number().check(z.int(), z.minimum(1), z.maximum(7)),
        intervals: z.array(interval),
      }),
    )
    .check(
      z.length(7),
      z.superRefine((days, ctx) => {
        days.forEach((d, di) => {
          const sorted = d.intervals
            .map((iv, k) => ({ ...iv, k }))
            .filter((iv) => TIME.test(iv.start) && TIME.test(iv.end))
            .sort((a, b) => toMinutes(a.start) - toMinutes(b.start));
          for (let i = 1; i < sorted.length; i += 1)
            if (toMinutes(sorted[i].start) < toMinutes(sorted[i - 1].end))
              ctx.addIssue({
                code: 'custom',
                path: [di, 'intervals', sorted[i].k, 'start'],
                message: 'Overlaps another interval that day',
              });
        });
      }),
    ),
  closures: z.array(
    z
      .object({
        from: z.string().check(z.regex(DATE, 'A date')),
        to: z.union([z.literal(''), z.string().check(z.regex(DATE, 'A date'))]),
        reason: z.string().check(
          z.trim(),
          z.minLength(1, 'Say why'),
          // zod/mini has no locale: the words zod's English locale gave this limit
          z.maxLength(200, 'Too big: expected string to have <=200 characters'),
        ),
      })
      .check(
        z.superRefine((c, ctx) => {
          if (c.to && DATE.test(c.from) && c.to < c.from)
            ctx.addIssue({ code: 'custom', path: ['to'], message: 'Not before the first day' });
        }),
      ),
  ),
  rules: z.object({
    slotStepMinutes: intText('Slot step', 5, 240).check(
      z.refine((v) => Number(v) % 5 === 0, 'A multiple of 5 minutes'),
    ),
    minNoticeMinutes: intText('Notice', 0, 20160),
    maxDaysAhead: intText('Days ahead', 1, 365),
    holdMinutes: intText('Hold', 5, 120),
    cancellationWindowHours: intText('Window', 0, 720),
  }),
});

export type SettingsFormValues = z.infer<typeof settingsFormSchema>;

export function settingsToForm(s: ShopSettings): SettingsFormValues {
  return {
    timeZone: s.timeZone,
    currency: s.currency,
    benches: String(s.benches),
    days: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({
      weekday,
      intervals: s.hours
        .filter((h) => h.weekday === weekday)
        .sort((a, b) => toMinutes(a.start) - toMinutes(b.start))
        .map((h) => ({ start: h.start, end: h.end })),
    })),
    closures: [...s.closures]
      .sort((a, b) => a.from.localeCompare(b.from))
      .map((c) => ({ from: c.from, to: c.to === c.from ? '' : c.to, reason: c.reason })),
    rules: {
      slotStepMinutes: String(s.rules.slotStepMinutes),
      minNoticeMinutes: String(s.rules.minNoticeMinutes),
      maxDaysAhead: String(s.rules.maxDaysAhead),
      holdMinutes: String(s.rules.holdMinutes),
      cancellationWindowHours: String(s.rules.cancellationWindowHours),
    },
  };
}

/** The body to PUT, and for each of its `hours` the form path of that interval. */
export function formToSettings(v: SettingsFormValues): { body: ShopSettings; hourPaths: string[] } {
  const hours: ShopSettings['hours'] = [];
  const hourPaths: string[] = [];
  v.days.forEach((d, di) =>
    d.intervals.forEach((iv, k) => {
      hours.push({ weekday: d.weekday, start: iv.start, end: iv.end });
      hourPaths.push(`days.${di}.intervals.${k}`);
    }),
  );
  return {
    body: {
      timeZone: v.timeZone,
      currency: v.currency,
      benches: Number(v.benches),
      hours,
      closures: v.closures.map((c) => ({ from: c.from, to: c.to || c.from, reason: c.reason.trim() })),
      rules: {
        slotStepMinutes: Number(v.rules.slotStepMinutes),
        minNoticeMinutes: Number(v.rules.minNoticeMinutes),
        maxDaysAhead: Number(v.rules.maxDaysAhead),
        holdMinutes: Number(v.rules.holdMinutes),
        cancellationWindowHours: Number(v.rules.cancellationWindowHours),
      },
    },
    hourPaths,
  };
}

/**
 * The form input a server `fields` name belongs to: `hours.2` → that interval's end when the
 * message is about closing ("must close after it opens"), else its start (off the grid, overlaps);
 * `hours.2.end` → its end; everything else keeps its name. `closures.N` is the same index in the
 * form (sent in the form's order). Null: no input shows it.
 */
export function formPathOfField(field: string, hourPaths: readonly string[], message = ''): string | null {
  const h = /^hours\.(\d+)(?:\.(start|end|weekday))?$/.exec(field);
  if (h) {
    const base = hourPaths[Number(h[1])];
    if (!base) return null;
    const end = h[2] === 'end' || (!h[2] && /close/i.test(message));
    return `${base}.${end ? 'end' : 'start'}`;
  }
  if (/^closures\.\d+\.(from|to|reason)$/.test(field)) return field;
  if (/^closures\.\d+$/.test(field)) return `${field}.from`;
  if (
    /^rules\.(slotStepMinutes|minNoticeMinutes|maxDaysAhead|holdMinutes|cancellationWindowHours)$/.test(field)
  )
    return field;
  if (field === 'timeZone' || field === 'currency' || field === 'benches') return field;
  return null;
}
