import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from '../database/columns';
import { User } from '../users/user.entity';

/**
 * One signed-in session (a sign-in on one browser or client). Its id is the `sid` claim of the
 * session JWT; signing out sets `revoked_at`, after which the token is refused even before it
 * expires. `expires_at` follows the token's expiry (renewal moves it) and lets old rows be cleared.
 */
@Entity('user_sessions')
@Index('IDX_user_sessions_user', ['userId', 'expiresAt'])
export class UserSession {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'user_id', type: 'uuid' })
  userId: string;

  @ManyToOne(() => User, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'user_id', foreignKeyConstraintName: 'FK_user_sessions_user' })
  user?: User;

  @Column({ name: 'expires_at', type: 'datetime', precision: 3 })
  expiresAt: Date;

  @Column({ name: 'revoked_at', type: 'datetime', precision: 3, nullable: true })
  revokedAt: Date | null;

  @CreatedAtColumn()
  createdAt: Date;
}
