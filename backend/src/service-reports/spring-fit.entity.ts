import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { SpringFit } from '@loamline/shared-types';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { CreatedAtColumn } from '../database/columns';
import { User } from '../users/user.entity';

/**
 * A fit of a part's geometry from an appointment's bench runs: proposed, then stored on the bike
 * (later baselines use it) or rejected by the technician.
 */
@Entity('spring_fits')
@Index('IDX_spring_fits_appointment', ['appointmentId', 'part', 'createdAt'])
export class SpringFitEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'appointment_id', type: 'uuid' })
  appointmentId: string;

  @ManyToOne(() => AppointmentEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'appointment_id', foreignKeyConstraintName: 'FK_spring_fits_appointment' })
  appointment?: AppointmentEntity;

  @Column({ type: 'enum', enum: ['fork', 'shock'] })
  part: 'fork' | 'shock';

  /** the fit as the API shows it */
  @Column({ type: 'json' })
  result: SpringFit;

  @Column({ type: 'enum', enum: ['proposed', 'stored', 'rejected'], default: 'proposed' })
  status: 'proposed' | 'stored' | 'rejected';

  @Column({ name: 'created_by', type: 'uuid', nullable: true })
  createdById: string | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_spring_fits_created_by' })
  createdBy?: User | null;

  @Column({ name: 'decided_at', type: 'datetime', precision: 3, nullable: true })
  decidedAt: Date | null;

  @CreatedAtColumn()
  createdAt: Date;
}
