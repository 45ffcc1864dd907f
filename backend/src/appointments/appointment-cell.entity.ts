import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryColumn } from 'typeorm';
import { AppointmentEntity } from './appointment.entity';

/**
 * One 5-minute cell of one bench kept by one live appointment. The primary key (shop, bench, cell)
 * makes a double booking impossible in any interleaving, on one server or a multi-primary cluster
 * (a second writer of the same key fails its insert or its certification).
 */
@Entity('appointment_cells')
@Index('IDX_appointment_cells_appointment', ['appointmentId'])
export class AppointmentCellEntity {
  @PrimaryColumn({ name: 'shop_id', type: 'uuid' })
  shopId: string;

  @PrimaryColumn({ type: 'tinyint', unsigned: true })
  bench: number;

  /** UTC start of the cell */
  @PrimaryColumn({ name: 'cell_at', type: 'datetime' })
  cellAt: Date;

  @Column({ name: 'appointment_id', type: 'uuid' })
  appointmentId: string;

  @ManyToOne(() => AppointmentEntity, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'appointment_id', foreignKeyConstraintName: 'FK_appointment_cells_appointment' })
  appointment?: AppointmentEntity;
}
