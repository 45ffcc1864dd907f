import { Injectable, Logger } from '@nestjs/common';
import { Cron, CronExpression } from '@nestjs/schedule';
import { AppointmentsService } from './appointments.service';

/**
 * The schedule: holds whose payment window passed are expired every minute, and reminders go out
 * 24 hours ahead (checked every 5 minutes). Safe with several app instances, on one database or
 * a Galera cluster: each claims rows with FOR UPDATE SKIP LOCKED (which keeps instances apart on
 * one server only), and a state change only commits if the row's version is still the one it read
 * — on a cluster two nodes' changes of one row conflict at certification, the loser rolls back
 * with its event and mail and retries. Reminders: a conditional UPDATE of `reminder_sent_at`.
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

  @Cron(CronExpression.EVERY_5_MINUTES, { name: 'appointment-reminders' })
  async reminders(): Promise<void> {
    try {
      const n = await this.appointments.sendReminders();
      if (n) this.logger.log(`sent ${n} reminder${n === 1 ? '' : 's'}`);
    } catch (e) {
      this.logger.warn(`sending reminders failed, will retry: ${(e as Error).message}`);
    }
  }
}
