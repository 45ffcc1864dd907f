import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Shop } from './shop.entity';

/** One opening interval of a shop on a weekday, wall clock in the shop's zone. */
@Entity('shop_opening_intervals')
@Index('IDX_shop_opening_intervals_shop', ['shopId', 'weekday'])
export class OpeningIntervalEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'shop_id', type: 'uuid' })
  shopId: string;

  @ManyToOne(() => Shop, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'shop_id', foreignKeyConstraintName: 'FK_shop_opening_intervals_shop' })
  shop?: Shop;

  /** ISO weekday, 1 = Monday … 7 = Sunday */
  @Column({ type: 'tinyint', unsigned: true })
  weekday: number;

  /** minutes after local midnight */
  @Column({ name: 'start_minute', type: 'smallint', unsigned: true })
  startMinute: number;

  @Column({ name: 'end_minute', type: 'smallint', unsigned: true })
  endMinute: number;
}
