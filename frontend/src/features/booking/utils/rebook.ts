import type { Appointment } from '@loamline/shared-types';
import { pathTo } from '@/config/paths';
import { choiceSearch } from '../hooks/use-booking-choice';
import { localDate } from './zoned-time';

/**
 * The shop's booking flow with this appointment's choices picked again (service, its day while it is
 * still ahead, bike and sheet), for "Pick another time" after a hold lapsed.
 */
export function rebookPath(
  a: Pick<Appointment, 'shop' | 'service' | 'start' | 'bike' | 'baselineSheetId'>,
  now: number = Date.now(),
): string {
  return (
    pathTo.shop(a.shop.slug) +
    choiceSearch({
      serviceId: a.service.id,
      day: Date.parse(a.start) > now ? localDate(a.start, a.shop.timeZone) : null,
      bikeId: a.bike?.id ?? null,
      sheetId: a.baselineSheetId,
      step: 'time',
    })
  );
}
