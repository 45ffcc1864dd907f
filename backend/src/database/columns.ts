import { CreateDateColumn, UpdateDateColumn } from 'typeorm';

/** `created_at DATETIME(3)`, set by MariaDB on insert (the server runs in UTC). */
export const CreatedAtColumn = (): PropertyDecorator =>
  CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  });

/** `updated_at DATETIME(3)`, set by MariaDB on insert and on every update. */
export const UpdatedAtColumn = (): PropertyDecorator =>
  UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  });
