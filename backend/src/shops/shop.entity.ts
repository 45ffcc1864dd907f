import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

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

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt: Date;

  @UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  })
  updatedAt: Date;
}
