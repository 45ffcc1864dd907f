import {
  Column,
  Entity,
  Index,
  JoinColumn,
  OneToMany,
  ManyToOne,
  PrimaryGeneratedColumn,
  VersionColumn,
} from 'typeorm';
import { PAYMENT_STATES, type PaymentState } from '@loamline/shared-types';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import { PaymentRefundEntity } from './payment-refund.entity';

/**
 * The money of one held appointment: its payment intent at the payment service (one per
 * appointment, created with an idempotency key derived from the appointment) and what came of it.
 * `status` mirrors the intent; `paid_minor` is what the service received.
 */
@Entity('payments')
@Index('IDX_payments_shop_created', ['shopId', 'createdAt'])
@Index('IDX_payments_cancel', ['cancelWanted', 'nextAttemptAt'])
export class PaymentEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'appointment_id', type: 'uuid' })
  @Index('UQ_payments_appointment', { unique: true })
  appointmentId: string;

  @ManyToOne(() => AppointmentEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'appointment_id', foreignKeyConstraintName: 'FK_payments_appointment' })
  appointment?: AppointmentEntity;

  @Column({ name: 'shop_id', type: 'uuid' })
  shopId: string;

  /** the payment service's id (pi_…) */
  @Column({ name: 'intent_id', type: 'varchar', length: 255 })
  @Index('UQ_payments_intent', { unique: true })
  intentId: string;

  @Column({ type: 'enum', enum: ['deposit', 'full'] })
  kind: 'deposit' | 'full';

  @Column({ name: 'amount_minor', type: 'int', unsigned: true })
  amountMinor: number;

  @Column({ type: 'char', length: 3 })
  currency: string;

  @Column({ type: 'enum', enum: PAYMENT_STATES, default: 'requires_payment_method' })
  status: PaymentState;

  @Column({ name: 'paid_minor', type: 'int', unsigned: true, default: 0 })
  paidMinor: number;

  @Column({ name: 'paid_at', type: 'datetime', precision: 3, nullable: true })
  paidAt: Date | null;

  @Column({ name: 'card_brand', type: 'varchar', length: 20, nullable: true })
  cardBrand: string | null;

  @Column({ name: 'card_last4', type: 'char', length: 4, nullable: true })
  cardLast4: string | null;

  /** why the last attempt failed, in the service's words, while unpaid */
  @Column({ name: 'last_error', type: 'varchar', length: 500, nullable: true })
  lastError: string | null;

  /** the rider moved the appointment inside the cancellation window of its old time: a later cancellation keeps the deposit */
  @Column({ name: 'deposit_kept', type: 'boolean', default: false })
  depositKept: boolean;

  /** the appointment ended unpaid (expired, cancelled): the intent must be cancelled at the service */
  @Column({ name: 'cancel_wanted', type: 'boolean', default: false })
  cancelWanted: boolean;

  @Column({ name: 'cancel_attempts', type: 'smallint', unsigned: true, default: 0 })
  cancelAttempts: number;

  @Column({ name: 'next_attempt_at', type: 'datetime', precision: 3, nullable: true })
  nextAttemptAt: Date | null;

  @OneToMany(() => PaymentRefundEntity, (r) => r.payment)
  refunds?: PaymentRefundEntity[];

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;

  @VersionColumn()
  version: number;
}
