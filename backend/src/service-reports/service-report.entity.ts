import { Column, Entity, JoinColumn, ManyToOne, PrimaryColumn, VersionColumn } from 'typeorm';
import type { ChecklistItem, PartSettings } from '@loamline/shared-types';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import { User } from '../users/user.entity';

/**
 * What the technician did and set on an appointment: a draft while they work, final once the
 * appointment is completed (then the rider sees it). One per appointment.
 */
@Entity('service_reports')
export class ServiceReportEntity {
  @PrimaryColumn({ name: 'appointment_id', type: 'uuid' })
  appointmentId: string;

  @ManyToOne(() => AppointmentEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'appointment_id', foreignKeyConstraintName: 'FK_service_reports_appointment' })
  appointment?: AppointmentEntity;

  @Column({ type: 'json' })
  checklist: ChecklistItem[];

  @Column({ type: 'varchar', length: 4000, default: '' })
  notes: string;

  @Column({ type: 'json', nullable: true })
  fork: PartSettings | null;

  @Column({ type: 'json', nullable: true })
  shock: PartSettings | null;

  @Column({ type: 'enum', enum: ['draft', 'final'], default: 'draft' })
  status: 'draft' | 'final';

  @Column({ name: 'updated_by', type: 'uuid', nullable: true })
  updatedById: string | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'updated_by', foreignKeyConstraintName: 'FK_service_reports_updated_by' })
  updatedBy?: User | null;

  @Column({ name: 'completed_at', type: 'datetime', precision: 3, nullable: true })
  completedAt: Date | null;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;

  @VersionColumn()
  version: number;
}
