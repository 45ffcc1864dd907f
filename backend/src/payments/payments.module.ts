import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AppointmentsModule } from '../appointments/appointments.module';
import { MailModule } from '../mail/mail.module';
import { AppointmentPaymentsController } from './appointment-payments.controller';
import { PaymentEventEntity } from './payment-event.entity';
import { PaymentGateway } from './payment-gateway';
import { PaymentJobs } from './payment-jobs';
import { PaymentRefundEntity } from './payment-refund.entity';
import { PaymentEntity } from './payment.entity';
import { PaymentsController } from './payments.controller';
import { PaymentsService } from './payments.service';
import { WorkshopPaymentsController } from './workshop-payments.controller';

/** Deposits and full payments through the payment service, its webhook, refunds and receipts. */
@Module({
  imports: [
    TypeOrmModule.forFeature([PaymentEntity, PaymentRefundEntity, PaymentEventEntity]),
    AppointmentsModule,
    MailModule,
  ],
  controllers: [PaymentsController, AppointmentPaymentsController, WorkshopPaymentsController],
  providers: [PaymentGateway, PaymentsService, PaymentJobs],
  exports: [PaymentsService],
})
export class PaymentsModule {}
