import { ConflictException, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { type EntityManager, type Repository } from 'typeorm';
import type { AuthUser, Role } from '@loamline/shared-types';
import { normaliseEmail } from '../common/email';
import { User } from './user.entity';

export interface NewUser {
  email: string;
  name: string;
  role: Role;
  shopId: string | null;
  passwordHash: string;
}

/** MariaDB's duplicate-key error (ER_DUP_ENTRY). */
export function isDuplicateKey(err: unknown): boolean {
  const e = err as { code?: string; errno?: number; driverError?: { code?: string } } | null;
  return e?.code === 'ER_DUP_ENTRY' || e?.errno === 1062 || e?.driverError?.code === 'ER_DUP_ENTRY';
}

export { normaliseEmail } from '../common/email';

@Injectable()
export class UsersService {
  constructor(@InjectRepository(User) private readonly users: Repository<User>) {}

  findById(id: string): Promise<User | null> {
    return this.users.findOneBy({ id });
  }

  findByEmail(email: string): Promise<User | null> {
    return this.users.findOneBy({ email: normaliseEmail(email) });
  }

  /** The one query that reads the password hash: for checking a sign-in. */
  findByEmailWithHash(email: string): Promise<User | null> {
    return this.users
      .createQueryBuilder('u')
      .addSelect('u.passwordHash')
      .where('u.email = :email', { email: normaliseEmail(email) })
      .getOne();
  }

  /** Creates the account; 409 when the address already has one. */
  async create(data: NewUser, manager?: EntityManager): Promise<User> {
    const repo = manager ? manager.getRepository(User) : this.users;
    const user = repo.create({ ...data, email: normaliseEmail(data.email), tokenVersion: 0 });
    try {
      await repo.insert(user);
    } catch (err) {
      if (isDuplicateKey(err))
        throw new ConflictException('An account with this e-mail address already exists.');
      throw err;
    }
    const saved = await repo.findOneByOrFail({ id: user.id });
    return saved;
  }

  /** Sets a new password and bumps the token version, so every older session stops working. */
  async setPassword(id: string, passwordHash: string, manager?: EntityManager): Promise<void> {
    const repo = manager ? manager.getRepository(User) : this.users;
    await repo
      .createQueryBuilder()
      .update(User)
      .set({ passwordHash, tokenVersion: () => 'token_version + 1' })
      .where('id = :id', { id })
      .execute();
  }

  staffOf(shopId: string): Promise<User[]> {
    return this.users.find({ where: { shopId }, order: { createdAt: 'ASC' } });
  }

  /** What the API shows of a user: never the password or its hash. */
  toAuthUser(user: User): AuthUser {
    return { id: user.id, email: user.email, name: user.name, role: user.role, shopId: user.shopId ?? null };
  }
}
