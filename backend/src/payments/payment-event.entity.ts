import { Column, Entity, Index, PrimaryColumn } from 'typeorm';
import { CreatedAtColumn } from '../database/columns';

/**
 * Each webhook event the app has acted on, once: the primary key is the service's event id, so a
 * delivery that arrives again (the service retries until it gets a 2xx) changes nothing.
 */
@Entity('payment_events')
export class PaymentEventEntity {
  @PrimaryColumn({ type: 'varchar', length: 255 })
  id: string;

  @Column({ type: 'varchar', length: 100 })
  type: string;

  @Column({ name: 'intent_id', type: 'varchar', length: 255, nullable: true })
  @Index('IDX_payment_events_intent')
  intentId: string | null;

  @CreatedAtColumn()
  createdAt: Date;
}
