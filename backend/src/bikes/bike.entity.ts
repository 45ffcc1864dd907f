import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
} from 'typeorm';
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
