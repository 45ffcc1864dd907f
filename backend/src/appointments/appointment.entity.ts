import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, VersionColumn } from 'typeorm';
import { APPOINTMENT_STATES, type AppointmentState } from '@loamline/shared-types';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import { Shop } from '../shops/shop.entity';
import { ShopServiceEntity } from '../shop-services/shop-service.entity';
import { User } from '../users/user.entity';

/**
 * A booked visit. Times are UTC instants (DATETIME(3), the server runs in UTC); the shop's zone
 * turns them into wall clock at the edges. While it is live (held and unexpired, requested,
 * confirmed) it keeps its bench through `appointment_cells`.
 */
@Entity('appointments')
@Index('IDX_appointments_shop_start', ['shopId', 'startAt'])
@Index('IDX_appointments_rider_start', ['riderId', 'startAt'])
@Index('IDX_appointments_status_hold', ['status', 'holdExpiresAt'])
// availability's bench-time query: one shop's live appointments ending after a time, covered
@Index('IDX_appointments_shop_live', ['shopId', 'status', 'keepUntil', 'startAt', 'bench', 'holdExpiresAt'])
export class AppointmentEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'shop_id', type: 'uuid' })
  shopId: string;

  @ManyToOne(() => Shop, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'shop_id', foreignKeyConstraintName: 'FK_appointments_shop' })
  shop?: Shop;

  @Column({ name: 'service_id', type: 'uuid' })
  serviceId: string;

  @ManyToOne(() => ShopServiceEntity, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'service_id', foreignKeyConstraintName: 'FK_appointments_service' })
  service?: ShopServiceEntity;

  @Column({ name: 'rider_id', type: 'uuid' })
  riderId: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'rider_id', foreignKeyConstraintName: 'FK_appointments_rider' })
  rider?: User;

  /** the rider's bike and sheet at booking time; kept as copies so later edits don't rewrite history */
  @Column({ name: 'bike_id', type: 'uuid', nullable: true })
  bikeId: string | null;

  @Column({ name: 'bike_snapshot', type: 'json', nullable: true })
  bikeSnapshot: { name: string; description: string } | null;

  @Column({ name: 'baseline_sheet_id', type: 'uuid', nullable: true })
  baselineSheetId: string | null;

  @Column({ type: 'varchar', length: 2000, default: '' })
  notes: string;

  @Column({ type: 'enum', enum: APPOINTMENT_STATES })
  status: AppointmentState;

  @Column({ name: 'start_at', type: 'datetime', precision: 3 })
  startAt: Date;

  @Column({ name: 'end_at', type: 'datetime', precision: 3 })
  endAt: Date;

  /** the end of the bench time it keeps (end + the service's buffer) */
  @Column({ name: 'keep_until', type: 'datetime', precision: 3 })
  keepUntil: Date;

  @Column({ type: 'tinyint', unsigned: true })
  bench: number;

  @Column({ name: 'hold_expires_at', type: 'datetime', precision: 3, nullable: true })
  holdExpiresAt: Date | null;

  /** price and deposit as agreed at booking, in minor units of `currency` */
  @Column({ name: 'price_minor', type: 'int', unsigned: true })
  priceMinor: number;

  @Column({ name: 'deposit_minor', type: 'int', unsigned: true })
  depositMinor: number;

  @Column({ type: 'char', length: 3 })
  currency: string;

  @Column({ name: 'proposed_start_at', type: 'datetime', precision: 3, nullable: true })
  proposedStartAt: Date | null;

  @Column({ name: 'decline_reason', type: 'varchar', length: 500, nullable: true })
  declineReason: string | null;

  @Column({ name: 'cancel_reason', type: 'varchar', length: 500, nullable: true })
  cancelReason: string | null;

  /** the calendar file's SEQUENCE (RFC 5545): raised on every change of time */
  @Column({ type: 'int', unsigned: true, default: 0 })
  sequence: number;

  @Column({ name: 'reminder_sent_at', type: 'datetime', precision: 3, nullable: true })
  reminderSentAt: Date | null;

  @VersionColumn()
  version: number;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
