import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { ATTACHMENT_KINDS, type AttachmentKind, type CurveRun } from '@loamline/shared-types';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { CreatedAtColumn } from '../database/columns';
import { User } from '../users/user.entity';

/** A photo or a measured curve on an appointment. The bytes live in the upload store under `storage_key`. */
export type StoredRun = Omit<CurveRun, 'comparison'>;

@Entity('appointment_attachments')
@Index('IDX_appointment_attachments_appointment', ['appointmentId', 'kind', 'createdAt'])
export class AppointmentAttachmentEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'appointment_id', type: 'uuid' })
  appointmentId: string;

  @ManyToOne(() => AppointmentEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'appointment_id', foreignKeyConstraintName: 'FK_appointment_attachments_appointment' })
  appointment?: AppointmentEntity;

  @Column({ type: 'enum', enum: ATTACHMENT_KINDS })
  kind: AttachmentKind;

  /** the uploaded file's name, cleaned for display (no path, no control characters) */
  @Column({ name: 'original_name', type: 'varchar', length: 200 })
  originalName: string;

  /** generated name in the upload store (never derived from the upload's name) */
  @Column({ name: 'storage_key', type: 'varchar', length: 200 })
  @Index('UQ_appointment_attachments_storage', { unique: true })
  storageKey: string;

  @Column({ name: 'thumbnail_key', type: 'varchar', length: 200, nullable: true })
  thumbnailKey: string | null;

  /** as detected from the content, not the name */
  @Column({ name: 'content_type', type: 'varchar', length: 100 })
  contentType: string;

  @Column({ name: 'size_bytes', type: 'int', unsigned: true })
  sizeBytes: number;

  /** a curve's parsed run (label, settings, units, points in mm and N) */
  @Column({ type: 'json', nullable: true })
  run: StoredRun | null;

  @Column({ name: 'uploaded_by', type: 'uuid', nullable: true })
  uploadedById: string | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL' })
  @JoinColumn({ name: 'uploaded_by', foreignKeyConstraintName: 'FK_appointment_attachments_uploaded_by' })
  uploadedBy?: User | null;

  @CreatedAtColumn()
  createdAt: Date;
}
