import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import type { BaselineInput, BaselineResult, BaselineSheetListItem } from '@loamline/shared-types';
import { User } from '../users/user.entity';

/** The key figures a list shows, kept beside the full result so lists need not load the curves. */
export type SheetSummary = Pick<BaselineSheetListItem, 'fork' | 'shock'>;

/** A saved baseline: the input and the result exactly as the model computed them then. */
@Entity('baseline_sheets')
@Index('IDX_baseline_sheets_owner_created', ['ownerId', 'createdAt'])
export class BaselineSheet {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'owner_id', type: 'uuid' })
  ownerId: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'owner_id', foreignKeyConstraintName: 'FK_baseline_sheets_owner' })
  owner?: User;

  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'json' })
  input: BaselineInput;

  @Column({ type: 'json' })
  result: BaselineResult;

  @Column({ type: 'json' })
  summary: SheetSummary;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
