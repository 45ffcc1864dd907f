import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { REFUND_KINDS, type RefundKind } from '@loamline/shared-types';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import { User } from '../users/user.entity';
import { PaymentEntity } from './payment.entity';

export const REFUND_STATES = ['pending', 'succeeded', 'failed'] as const;
export type RefundState = (typeof REFUND_STATES)[number];

/**
 * Money given back, with who and why. Written in the transaction of the change that causes it
 * (a decline, a cancellation, a late payment, an owner's refund) as `pending`, then made at the
 * payment service by the refund worker with an idempotency key derived from this row, so a retry
 * (after a crash, with the service down, from a second app instance) refunds once.
 * `request_key` is unique: the same decline, cancellation or refund form never makes two rows.
 */
@Entity('payment_refunds')
@Index('IDX_payment_refunds_due', ['status', 'nextAttemptAt'])
export class PaymentRefundEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'payment_id', type: 'uuid' })
  @Index('IDX_payment_refunds_payment')
  paymentId: string;

  @ManyToOne(() => PaymentEntity, (p) => p.refunds, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'payment_id', foreignKeyConstraintName: 'FK_payment_refunds_payment' })
  payment?: PaymentEntity;

  @Column({ name: 'request_key', type: 'varchar', length: 120 })
  @Index('UQ_payment_refunds_request', { unique: true })
  requestKey: string;

  @Column({ name: 'amount_minor', type: 'int', unsigned: true })
  amountMinor: number;

  @Column({ type: 'enum', enum: REFUND_KINDS })
  kind: RefundKind;

  @Column({ type: 'varchar', length: 500 })
  reason: string;

  @Column({ name: 'actor_id', type: 'uuid', nullable: true })
  actorId: string | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'actor_id', foreignKeyConstraintName: 'FK_payment_refunds_actor' })
  actor?: User | null;

  @Column({ name: 'actor_side', type: 'enum', enum: ['rider', 'staff', 'system'] })
  actorSide: 'rider' | 'staff' | 'system';

  @Column({ type: 'enum', enum: REFUND_STATES, default: 'pending' })
  status: RefundState;

  /** the payment service's id (re_…) once made */
  @Column({ name: 'refund_ref', type: 'varchar', length: 255, nullable: true })
  refundRef: string | null;

  @Column({ type: 'smallint', unsigned: true, default: 0 })
  attempts: number;

  @Column({ name: 'next_attempt_at', type: 'datetime', precision: 3 })
  nextAttemptAt: Date;

  @Column({ name: 'last_error', type: 'varchar', length: 500, nullable: true })
  lastError: string | null;

  @Column({ name: 'done_at', type: 'datetime', precision: 3, nullable: true })
  doneAt: Date | null;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
