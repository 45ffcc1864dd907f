import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from '../database/columns';
import { AppointmentEntity } from './appointment.entity';

/** What happened to an appointment, who did it and when: the history staff and riders can read. */
@Entity('appointment_events')
@Index('IDX_appointment_events_appointment', ['appointmentId', 'createdAt'])
export class AppointmentEventEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'appointment_id', type: 'uuid' })
  appointmentId: string;

  @ManyToOne(() => AppointmentEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'appointment_id', foreignKeyConstraintName: 'FK_appointment_events_appointment' })
  appointment?: AppointmentEntity;

  /** an AppointmentEvent of the transition table, or `created` */
  @Column({ type: 'varchar', length: 32 })
  event: string;

  /** the user who did it; null for the system (expiry, payments) */
  @Column({ name: 'actor_id', type: 'uuid', nullable: true })
  actorId: string | null;

  @Column({ type: 'json', nullable: true })
  detail: Record<string, unknown> | null;

  @CreatedAtColumn()
  createdAt: Date;
}
