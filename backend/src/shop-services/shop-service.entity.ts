import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import { Shop } from '../shops/shop.entity';

/** A service a shop offers: what it takes on the bench and what it costs. */
@Entity('shop_services')
@Index('IDX_shop_services_shop', ['shopId', 'active'])
export class ShopServiceEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'shop_id', type: 'uuid' })
  shopId: string;

  @ManyToOne(() => Shop, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'shop_id', foreignKeyConstraintName: 'FK_shop_services_shop' })
  shop?: Shop;

  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'varchar', length: 1000, default: '' })
  description: string;

  @Column({ name: 'duration_minutes', type: 'smallint', unsigned: true })
  durationMinutes: number;

  @Column({ name: 'buffer_after_minutes', type: 'smallint', unsigned: true, default: 0 })
  bufferAfterMinutes: number;

  /** minor units of the shop's currency */
  @Column({ name: 'price_minor', type: 'int', unsigned: true })
  priceMinor: number;

  @Column({ name: 'deposit_minor', type: 'int', unsigned: true })
  depositMinor: number;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  /** the work this service includes, the service report's checklist (null: the default list) */
  @Column({ type: 'json', nullable: true })
  checklist: string[] | null;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
