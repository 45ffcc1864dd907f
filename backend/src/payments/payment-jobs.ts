import { Injectable, Logger } from '@nestjs/common';
import { Interval } from '@nestjs/schedule';
import { PaymentsService } from './payments.service';

/**
 * The sweep behind the refund and cancellation worker: whatever a kick after a commit did not get
 * to (the payment service down, the app restarted) is tried again every 15 seconds, backing off
 * per row. Safe with several app instances (rows are claimed with a lease).
 */
@Injectable()
export class PaymentJobs {
  private readonly logger = new Logger(PaymentJobs.name);

  constructor(private readonly payments: PaymentsService) {}

  @Interval('settle-payments', 15_000)
  sweep(): void {
    try {
      this.payments.kick();
    } catch (e) {
      this.logger.warn(`settling payments failed, will retry: ${(e as Error).message}`);
    }
  }
}
