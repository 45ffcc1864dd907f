import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { CreatedAtColumn } from '../../database/columns';

/**
 * One e-mail the app has to send, written in the same transaction as the change it reports and
 * sent by the relay (mail-relay.ts). The message itself is kept encrypted (AES-256-GCM, see
 * outbox-crypto.ts) because it may carry a live link token, and is wiped once sent or given up.
 */
@Entity('mail_outbox')
@Index('IDX_mail_outbox_due', ['sentAt', 'failedAt', 'nextAttemptAt'])
export class MailOutboxEntry {
  @PrimaryGeneratedColumn({ type: 'bigint', unsigned: true })
  id: string;

  /** what the mail is about, e.g. `password-reset`, `invitation` (hooks run per kind once sent) */
  @Column({ type: 'varchar', length: 40 })
  kind: string;

  /** the row the mail belongs to (an invitation's id), when a hook needs it */
  @Column({ name: 'ref_id', type: 'uuid', nullable: true })
  refId: string | null;

  /** `{to, subject, text, html}` as JSON, encrypted; NULL once sent or given up */
  @Column({ type: 'blob', nullable: true })
  payload: Buffer | null;

  @Column({ type: 'int', unsigned: true, default: 0 })
  attempts: number;

  @Column({ name: 'next_attempt_at', type: 'datetime', precision: 3 })
  nextAttemptAt: Date;

  /** the relay run that holds the row while it sends it */
  @Column({ name: 'claimed_by', type: 'char', length: 36, nullable: true })
  claimedBy: string | null;

  /** after this another relay may take the row again (the holder died mid-send) */
  @Column({ name: 'claimed_until', type: 'datetime', precision: 3, nullable: true })
  claimedUntil: Date | null;

  @Column({ name: 'sent_at', type: 'datetime', precision: 3, nullable: true })
  sentAt: Date | null;

  /** set when the relay gave up after the last attempt */
  @Column({ name: 'failed_at', type: 'datetime', precision: 3, nullable: true })
  failedAt: Date | null;

  @Column({ name: 'last_error', type: 'varchar', length: 500, nullable: true })
  lastError: string | null;

  @CreatedAtColumn()
  createdAt: Date;
}
