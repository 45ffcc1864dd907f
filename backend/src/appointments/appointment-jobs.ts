import { Injectable, Logger } from '@nestjs/common';
import { Cron, CronExpression } from '@nestjs/schedule';
import { AppointmentsService } from './appointments.service';

/**
 * The schedule: holds whose payment window passed are expired every minute. Safe with several app
 * instances on one database: each claims rows with FOR UPDATE SKIP LOCKED and a state change only
 * commits if the row's version is still the one it read.
 */
@Injectable()
export class AppointmentJobs {
  private readonly logger = new Logger(AppointmentJobs.name);

  constructor(private readonly appointments: AppointmentsService) {}

  @Cron(CronExpression.EVERY_MINUTE, { name: 'expire-holds' })
  async expireHolds(): Promise<void> {
    try {
      const n = await this.appointments.expireDue();
      if (n) this.logger.log(`expired ${n} unpaid hold${n === 1 ? '' : 's'}`);
    } catch (e) {
      this.logger.warn(`expiring holds failed, will retry: ${(e as Error).message}`);
    }
  }
}
