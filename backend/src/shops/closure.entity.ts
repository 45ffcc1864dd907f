import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Shop } from './shop.entity';

/** Days a shop is closed (local dates in its zone, inclusive), with the reason riders see. */
@Entity('shop_closures')
@Index('IDX_shop_closures_shop', ['shopId', 'fromDate'])
export class ClosureEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'shop_id', type: 'uuid' })
  shopId: string;

  @ManyToOne(() => Shop, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'shop_id', foreignKeyConstraintName: 'FK_shop_closures_shop' })
  shop?: Shop;

  /** YYYY-MM-DD */
  @Column({ name: 'from_date', type: 'date' })
  fromDate: string;

  @Column({ name: 'to_date', type: 'date' })
  toDate: string;

  @Column({ type: 'varchar', length: 200 })
  reason: string;
}
