import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn, UpdatedAtColumn } from '../database/columns';
import { ROLES, type Role } from '@loamline/shared-types';
import { Shop } from '../shops/shop.entity';

/**
 * A person who signs in: a rider, or staff (technician, owner) of one shop (`shopId`).
 * The password hash is never selected unless asked for (`select: false`).
 */
@Entity('users')
@Index('UQ_users_email', ['email'], { unique: true })
export class User {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  /** normalised (common/email.ts: NFC, trimmed, lower-cased, IDNA domain); unique, compared byte for byte */
  @Column({ type: 'varchar', length: 254, charset: 'utf8mb4', collation: 'utf8mb4_bin' })
  email: string;

  @Column({ type: 'varchar', length: 100 })
  name: string;

  @Column({ type: 'enum', enum: ROLES, default: 'rider' })
  role: Role;

  /** `$scrypt$ln=17,r=8,p=1$<salt>$<hash>` (see auth/password-hasher.ts) */
  @Column({ name: 'password_hash', type: 'varchar', length: 255, select: false })
  passwordHash: string;

  /** bumped when the password changes: sessions signed with an older value are refused */
  @Column({ name: 'token_version', type: 'int', unsigned: true, default: 0 })
  tokenVersion: number;

  @Column({ name: 'shop_id', type: 'uuid', nullable: true })
  shopId: string | null;

  @ManyToOne(() => Shop, { nullable: true, onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'shop_id', foreignKeyConstraintName: 'FK_users_shop' })
  shop?: Shop | null;

  @CreatedAtColumn()
  createdAt: Date;

  @UpdatedAtColumn()
  updatedAt: Date;
}
