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

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
