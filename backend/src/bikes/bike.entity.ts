import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import type { ForkInput, ShockInput } from '@loamline/shared-types';
import { User } from '../users/user.entity';

/** A bike in a rider's garage; the specs are the compute API's fork and shock inputs, as JSON. */
@Entity('bikes')
@Index('IDX_bikes_owner_created', ['ownerId', 'createdAt'])
export class Bike {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'owner_id', type: 'uuid' })
  ownerId: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'owner_id', foreignKeyConstraintName: 'FK_bikes_owner' })
  owner?: User;

  @Column({ type: 'varchar', length: 100 })
  name: string;

  @Column({ type: 'json', nullable: true })
  fork: ForkInput | null;

  @Column({ type: 'json', nullable: true })
  shock: ShockInput | null;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
