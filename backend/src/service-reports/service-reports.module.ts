import { Logger, Module } from '@nestjs/common';
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
import { S3UploadStore } from './s3-upload-store';
import { DiskUploadStore, UPLOAD_STORE, type UploadStore } from './upload-store';
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
      useFactory: (config: ConfigService) => uploadStore(config.getOrThrow<AppConfig>('app')),
    },
  ],
  exports: [ServiceReportsService, UPLOAD_STORE],
})
export class ServiceReportsModule {}

/**
 * The store UPLOADS_STORE names. For S3, the bucket is checked first (created when
 * S3_CREATE_BUCKET=true): a missing bucket or refused credentials stop the boot; a store that does
 * not answer only logs, and uploads answer 503 until it does.
 */
async function uploadStore(app: AppConfig): Promise<UploadStore> {
  if (app.uploadsStore !== 's3' || !app.s3) return new DiskUploadStore(app.uploadsDir);
  const store = new S3UploadStore(app.s3);
  const logger = new Logger('UploadStore');
  const found = await store.checkBucket();
  const where = `bucket "${app.s3.bucket}" at ${app.s3.endpoint ?? app.s3.region}`;
  if (found === 'unreachable')
    logger.error(`uploads: ${where} does not answer; uploads and downloads answer 503 until it does`);
  else logger.log(`uploads: ${where}${found === 'created' ? ' (created)' : ''}`);
  return store;
}
