import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';

/** A suspension service shop. Its staff are users with `shop_id` set. */
@Entity('shops')
@Index('UQ_shops_slug', ['slug'], { unique: true })
export class Shop {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  /** the shop's address in URLs, e.g. `kettle-ridge-suspension-lab` */
  @Column({ type: 'varchar', length: 80 })
  slug: string;

  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'varchar', length: 120 })
  town: string;

  /** IANA time-zone name */
  @Column({ name: 'time_zone', type: 'varchar', length: 64 })
  timeZone: string;

  /** ISO 4217 code */
  @Column({ type: 'char', length: 3 })
  currency: string;

  /** how many appointments the shop runs at once */
  @Column({ type: 'tinyint', unsigned: true, default: 1 })
  benches: number;

  /** minutes between offered starts (on the 5-minute grid) */
  @Column({ name: 'slot_step_minutes', type: 'smallint', unsigned: true, default: 30 })
  slotStepMinutes: number;

  @Column({ name: 'min_notice_minutes', type: 'int', unsigned: true, default: 720 })
  minNoticeMinutes: number;

  @Column({ name: 'max_days_ahead', type: 'smallint', unsigned: true, default: 60 })
  maxDaysAhead: number;

  /** how long an unpaid booking keeps its time */
  @Column({ name: 'hold_minutes', type: 'smallint', unsigned: true, default: 15 })
  holdMinutes: number;

  /** a rider cancelling at least this many hours ahead gets everything back */
  @Column({ name: 'cancellation_window_hours', type: 'smallint', unsigned: true, default: 48 })
  cancellationWindowHours: number;

  /** SHA-256 (hex) of the secret in the staff calendar feed's URL; null until the owner makes one */
  @Column({ name: 'calendar_token_hash', type: 'char', length: 64, nullable: true })
  calendarTokenHash: string | null;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
