import { Inject, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { type DataSource, type EntityManager } from 'typeorm';
import { CLOCK, type Clock } from '../common/clock/clock';
import { User } from '../users/user.entity';
import { UserSession } from './user-session.entity';

/** Sessions in the database: started at sign-in, checked on every request, revoked at sign-out. */
@Injectable()
export class SessionStore {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @Inject(CLOCK) private readonly clock: Clock,
  ) {}

  /** A new session row for the user; clears the user's rows that expired a day ago or more. */
  async start(userId: string, ttlSeconds: number, manager?: EntityManager): Promise<string> {
    const m = manager ?? this.dataSource.manager;
    const now = this.clock.now();
    await m
      .createQueryBuilder()
      .delete()
      .from(UserSession)
      .where('user_id = :userId AND expires_at < :old', { userId, old: new Date(now.getTime() - 86_400_000) })
      .execute();
    const row = m.create(UserSession, {
      userId,
      expiresAt: new Date(now.getTime() + ttlSeconds * 1000),
      revokedAt: null,
    });
    await m.insert(UserSession, row);
    return row.id;
  }

  /**
   * The user of a live session in one query: the session exists, belongs to the user, is not
   * revoked, and the user's token version still matches. Null otherwise.
   */
  findUser(userId: string, sessionId: string, tokenVersion: number): Promise<User | null> {
    return this.dataSource
      .getRepository(User)
      .createQueryBuilder('u')
      .innerJoin(UserSession, 's', 's.user_id = u.id AND s.id = :sid AND s.revoked_at IS NULL', {
        sid: sessionId,
      })
      .where('u.id = :userId AND u.token_version = :tv', { userId, tv: tokenVersion })
      .getOne();
  }

  /** Moves the row's expiry along with a renewed token. */
  async extend(sessionId: string, ttlSeconds: number): Promise<void> {
    await this.dataSource
      .getRepository(UserSession)
      .update({ id: sessionId }, { expiresAt: new Date(this.clock.now().getTime() + ttlSeconds * 1000) });
  }

  async revoke(sessionId: string): Promise<void> {
    await this.dataSource
      .createQueryBuilder()
      .update(UserSession)
      .set({ revokedAt: this.clock.now() })
      .where('id = :id AND revoked_at IS NULL', { id: sessionId })
      .execute();
  }

  /** Every session of the user ends: the token version moves on and all rows are revoked. */
  async revokeAll(userId: string, manager?: EntityManager): Promise<void> {
    const m = manager ?? this.dataSource.manager;
    await m
      .createQueryBuilder()
      .update(User)
      .set({ tokenVersion: () => 'token_version + 1' })
      .where('id = :userId', { userId })
      .execute();
    await m
      .createQueryBuilder()
      .update(UserSession)
      .set({ revokedAt: this.clock.now() })
      .where('user_id = :userId AND revoked_at IS NULL', { userId })
      .execute();
  }
}
