import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AppointmentsModule } from '../appointments/appointments.module';
import type { AppConfig } from '../config/app.config';
import { MailModule } from '../mail/mail.module';
import { AppointmentAttachmentEntity } from './appointment-attachment.entity';
import { RiderReportsController } from './rider-reports.controller';
import { ServiceReportEntity } from './service-report.entity';
import { ServiceReportsService } from './service-reports.service';
import { SpringFitEntity } from './spring-fit.entity';
import { DiskUploadStore, UPLOAD_STORE } from './upload-store';
import { WorkshopReportsController } from './workshop-reports.controller';

/** Service reports: the technician's report, its photos and bench curves, the completion mail. */
@Module({
  imports: [
    TypeOrmModule.forFeature([ServiceReportEntity, AppointmentAttachmentEntity, SpringFitEntity]),
    AppointmentsModule,
    MailModule,
  ],
  controllers: [WorkshopReportsController, RiderReportsController],
  providers: [
    ServiceReportsService,
    {
      provide: UPLOAD_STORE,
      inject: [ConfigService],
      useFactory: (config: ConfigService) =>
        new DiskUploadStore(config.getOrThrow<AppConfig>('app').uploadsDir),
    },
  ],
  exports: [ServiceReportsService, UPLOAD_STORE],
})
export class ServiceReportsModule {}
