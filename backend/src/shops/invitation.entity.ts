import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from '../database/columns';
import { STAFF_ROLES, type StaffRole } from '@loamline/shared-types';
import { User } from '../users/user.entity';
import { Shop } from './shop.entity';

/** An owner's invitation to join the shop's staff, e-mailed as `/join?token=…` (only its hash is kept). */
@Entity('invitations')
@Index('UQ_invitations_token_hash', ['tokenHash'], { unique: true })
export class Invitation {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Index('IDX_invitations_shop')
  @Column({ name: 'shop_id', type: 'uuid' })
  shopId: string;

  @ManyToOne(() => Shop, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'shop_id', foreignKeyConstraintName: 'FK_invitations_shop' })
  shop?: Shop;

  /** normalised like users.email (common/email.ts), compared byte for byte; the new account gets it */
  @Index('IDX_invitations_email')
  @Column({ type: 'varchar', length: 254, charset: 'utf8mb4', collation: 'utf8mb4_bin' })
  email: string;

  @Column({ type: 'enum', enum: STAFF_ROLES })
  role: StaffRole;

  /** hex SHA-256 of the token in the link */
  @Column({ name: 'token_hash', type: 'char', length: 64 })
  tokenHash: string;

  @Column({ name: 'invited_by_id', type: 'uuid', nullable: true })
  invitedById: string | null;

  @ManyToOne(() => User, { nullable: true, onDelete: 'SET NULL' })
  @JoinColumn({ name: 'invited_by_id', foreignKeyConstraintName: 'FK_invitations_invited_by' })
  invitedBy?: User | null;

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt: Date;

  @Column({ name: 'accepted_at', type: 'datetime', precision: 3, nullable: true })
  acceptedAt: Date | null;

  /** set when the owner sent a newer invitation to the same address */
  @Column({ name: 'revoked_at', type: 'datetime', precision: 3, nullable: true })
  revokedAt: Date | null;

  @CreatedAtColumn()
  createdAt: Date;
}
