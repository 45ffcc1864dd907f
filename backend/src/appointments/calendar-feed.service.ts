import { Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DateTime } from 'luxon';
import { Between, type DataSource, In } from 'typeorm';
import { hashLinkToken, newLinkToken } from '../auth/tokens';
import type { AppConfig } from '../config/app.config';
import { CLOCK, type Clock } from '../common/clock/clock';
import { NotFoundError } from '../common/errors/domain-errors';
import { Shop } from '../shops/shop.entity';
import { AppointmentEntity } from './appointment.entity';
import { scheduleFeed } from './calendar-file';

/** How far back the feed reaches, days. */
const FEED_PAST_DAYS = 30;

/**
 * The shop's private calendar feed: an ICS URL with a secret token (only its SHA-256 is kept) that
 * the staff add to their own calendar apps. The owner makes a new one, which ends the old one.
 */
@Injectable()
export class CalendarFeedService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly config: ConfigService,
    @Inject(CLOCK) private readonly clock: Clock,
  ) {}

  async renew(shopId: string): Promise<{ url: string }> {
    const shop = await this.db.getRepository(Shop).findOneByOrFail({ id: shopId });
    const token = newLinkToken();
    await this.db.getRepository(Shop).update({ id: shopId }, { calendarTokenHash: hashLinkToken(token) });
    return { url: `${this.config.getOrThrow<AppConfig>('app').url}/api/calendar/${shop.slug}/${token}.ics` };
  }

  async feed(slug: string, token: string): Promise<string> {
    const shop = await this.db.getRepository(Shop).findOneBy({ slug });
    // a missing shop, no feed yet and a wrong token all look the same
    if (!shop?.calendarTokenHash || hashLinkToken(token) !== shop.calendarTokenHash)
      throw new NotFoundError('No such calendar.');
    const now = DateTime.fromJSDate(this.clock.now());
    const rows = await this.db.getRepository(AppointmentEntity).find({
      where: {
        shopId: shop.id,
        status: In(['requested', 'confirmed', 'completed']),
        startAt: Between(
          now.minus({ days: FEED_PAST_DAYS }).toJSDate(),
          now.plus({ days: shop.maxDaysAhead + 1 }).toJSDate(),
        ),
      },
      relations: { service: true, rider: true },
      order: { startAt: 'ASC' },
    });
    const domain = new URL(this.config.getOrThrow<AppConfig>('app').url).hostname;
    return scheduleFeed(
      shop.name,
      shop.timeZone,
      rows.map((a) => ({
        id: a.id,
        start: a.startAt,
        end: a.endAt,
        timeZone: shop.timeZone,
        sequence: a.sequence,
        summary: `${a.status === 'requested' ? '(request) ' : ''}${a.service!.name} — ${a.rider!.name}`,
        description: [a.bikeSnapshot?.description, a.notes].filter(Boolean).join('\n'),
        location: `${shop.name}, bench ${a.bench}`,
      })),
      domain,
    );
  }
}
