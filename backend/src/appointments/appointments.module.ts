import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ShopSettingsModule } from '../shop-settings/shop-settings.module';
import { AppointmentCellEntity } from './appointment-cell.entity';
import { AppointmentEventEntity } from './appointment-event.entity';
import { AppointmentJobs } from './appointment-jobs';
import { AppointmentNotifier } from './appointment-notifier';
import { AppointmentEntity } from './appointment.entity';
import { AppointmentsController } from './appointments.controller';
import { CalendarFeedController } from './calendar-feed.controller';
import { CalendarFeedService } from './calendar-feed.service';
import { APPOINTMENT_LISTENER, AppointmentsService } from './appointments.service';
import { WorkshopAppointmentsController } from './workshop-appointments.controller';

/** Bookings: availability, the appointment's life, the Workshop's requests, the schedule's jobs. */
@Module({
  imports: [
    TypeOrmModule.forFeature([AppointmentEntity, AppointmentCellEntity, AppointmentEventEntity]),
    ShopSettingsModule,
  ],
  controllers: [AppointmentsController, WorkshopAppointmentsController, CalendarFeedController],
  providers: [
    AppointmentsService,
    AppointmentJobs,
    CalendarFeedService,
    AppointmentNotifier,
    { provide: APPOINTMENT_LISTENER, useExisting: AppointmentNotifier },
  ],
  exports: [AppointmentsService],
})
export class AppointmentsModule {}
