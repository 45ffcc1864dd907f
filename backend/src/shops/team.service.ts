import { ConflictException, Inject, Injectable, NotFoundException, type OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { IsNull, MoreThan, type DataSource, type EntityManager, type Repository } from 'typeorm';
import type {
  InvitationLookup,
  InvitationView,
  StaffRole,
  TeamMember,
  TeamResponse,
} from '@loamline/shared-types';
import { LINK_TOKEN } from '../auth/dto/password-reset.dto';
import { PasswordHasher } from '../auth/password-hasher';
import { hashLinkToken, newLinkToken } from '../auth/tokens';
import { CLOCK, type Clock } from '../common/clock/clock';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import type { AppConfig, AuthConfig } from '../config/app.config';
import type { MailOutboxEntry } from '../mail/outbox/mail-outbox.entity';
import { MailOutbox } from '../mail/outbox/mail-outbox';
import { MailRelay } from '../mail/outbox/mail-relay';
import { invitationMail } from '../mail/templates';
import { User } from '../users/user.entity';
import { UsersService } from '../users/users.service';
import { Invitation } from './invitation.entity';
import { ShopsService } from './shops.service';

const notFound = (): NotFoundException =>
  new NotFoundException('This invitation is not valid any more: it was used, replaced or has expired.');

/** A shop's staff and the owner's invitations by e-mail (`/join?token=…`, only the token's hash is kept). */
@Injectable()
export class TeamService implements OnModuleInit {
  private readonly appUrl: string;
  private readonly ttlHours: number;

  constructor(
    @InjectRepository(Invitation) private readonly invitations: Repository<Invitation>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly shops: ShopsService,
    private readonly users: UsersService,
    private readonly hasher: PasswordHasher,
    private readonly outbox: MailOutbox,
    private readonly relay: MailRelay,
    @Inject(CLOCK) private readonly clock: Clock,
    config: ConfigService,
  ) {
    this.appUrl = config.getOrThrow<AppConfig>('app').url.replace(/\/+$/, '');
    this.ttlHours = config.getOrThrow<AuthConfig>('auth').invitationTtlHours;
  }

  onModuleInit(): void {
    this.relay.onSent('invitation', (manager, entry) => this.replaceOlder(manager, entry));
  }

  /**
   * The staff of the signed-in user's shop and the invitations still open (not for an address
   * that has an account by now, e.g. because it joined another shop).
   */
  async team(staff: RequestUser): Promise<TeamResponse> {
    const shop = await this.shops.getById(staff.shopId!);
    const [members, open] = await Promise.all([
      this.users.staffOf(shop.id),
      this.invitations
        .createQueryBuilder('i')
        .leftJoinAndSelect('i.invitedBy', 'by')
        .where('i.shop_id = :shopId AND i.accepted_at IS NULL AND i.revoked_at IS NULL', { shopId: shop.id })
        .andWhere('i.expires_at > :now', { now: this.clock.now() })
        .andWhere('NOT EXISTS (SELECT 1 FROM users u WHERE u.email = i.email)')
        .orderBy('i.created_at', 'DESC')
        .getMany(),
    ]);
    return {
      shop: this.shops.toSummary(shop),
      members: members.map(toMember),
      invitations: open.map((i) => toView(i, i.invitedBy?.name ?? null)),
    };
  }

  /**
   * An owner invites someone to the shop's staff: the invitation and its mail (an outbox row) in
   * one transaction, so the answer is 201 even while the mail server is down and the mail follows
   * when it is back. A newer invitation to the same address replaces the older one only once its
   * own mail has gone out (replaceOlder): a send that fails changes nothing for the invitee.
   * 409 when the address already has an account (one account, one role).
   */
  async invite(owner: RequestUser, email: string, role: StaffRole): Promise<InvitationView> {
    const shop = await this.shops.getById(owner.shopId!);
    if (await this.users.findByEmail(email)) {
      throw new ConflictException('This address already has a Loamline account.');
    }
    const token = newLinkToken();
    const expiresAt = new Date(this.clock.now().getTime() + this.ttlHours * 3_600_000);
    const link = `${this.appUrl}/join?token=${encodeURIComponent(token)}`;
    const { invitation, mailId } = await this.dataSource.transaction(async (manager) => {
      const repo = manager.getRepository(Invitation);
      const created = repo.create({
        shopId: shop.id,
        email,
        role,
        tokenHash: hashLinkToken(token),
        invitedById: owner.id,
        expiresAt,
        acceptedAt: null,
        revokedAt: null,
      });
      await repo.insert(created);
      const mail = invitationMail(email, shop.name, role, owner.name, link, expiresAt);
      const id = await this.outbox.enqueue(manager, mail, { kind: 'invitation', refId: created.id });
      return { invitation: await repo.findOneByOrFail({ id: created.id }), mailId: id };
    });
    this.outbox.sendSoon([mailId]);
    return toView(invitation, owner.name);
  }

  /** What the join page shows for a token; 404 when it is unknown, used, replaced or expired. */
  async lookup(token: string): Promise<InvitationLookup> {
    const inv = await this.findOpen(token);
    if (!inv) throw notFound();
    const shop = await this.shops.getById(inv.shopId);
    return { shopName: shop.name, email: inv.email, role: inv.role };
  }

  /** Creates the staff account the invitation was for; the invitation works once. */
  async accept(token: string, name: string, password: string): Promise<User> {
    const inv = await this.findOpen(token);
    if (!inv) throw notFound();
    const passwordHash = await this.hasher.hash(password);
    const now = this.clock.now();
    return this.dataSource.transaction(async (manager) => {
      const taken = await manager
        .createQueryBuilder()
        .update(Invitation)
        .set({ acceptedAt: now })
        .where('id = :id AND accepted_at IS NULL AND revoked_at IS NULL AND expires_at > :now', {
          id: inv.id,
          now,
        })
        .execute();
      if (taken.affected !== 1) throw notFound();
      // The address has an account now: every other open invitation to it, in any shop, ends.
      await manager
        .createQueryBuilder()
        .update(Invitation)
        .set({ revokedAt: now })
        .where('email = :email AND id <> :id AND accepted_at IS NULL AND revoked_at IS NULL', {
          email: inv.email,
          id: inv.id,
        })
        .execute();
      return this.users.create(
        { email: inv.email, name, role: inv.role, shopId: inv.shopId, passwordHash },
        manager,
      );
    });
  }

  /**
   * Runs in the relay's transaction once an invitation mail went out: the invitations to the same
   * address from the same shop that are older than this one end now, not before.
   */
  private async replaceOlder(manager: EntityManager, entry: MailOutboxEntry): Promise<void> {
    if (!entry.refId) return;
    const sent = await manager.getRepository(Invitation).findOneBy({ id: entry.refId });
    if (!sent) return;
    await manager
      .createQueryBuilder()
      .update(Invitation)
      .set({ revokedAt: this.clock.now() })
      .where('shop_id = :shopId AND email = :email AND id <> :id', {
        shopId: sent.shopId,
        email: sent.email,
        id: sent.id,
      })
      .andWhere('created_at <= :createdAt AND accepted_at IS NULL AND revoked_at IS NULL', {
        createdAt: sent.createdAt,
      })
      .execute();
  }

  private async findOpen(token: string): Promise<Invitation | null> {
    if (!LINK_TOKEN.test(token)) return null;
    const inv = await this.invitations.findOneBy({
      tokenHash: hashLinkToken(token),
      acceptedAt: IsNull(),
      revokedAt: IsNull(),
      expiresAt: MoreThan(this.clock.now()),
    });
    if (!inv) return null;
    // An address that has an account by now (it joined elsewhere) cannot join again.
    if (await this.dataSource.getRepository(User).existsBy({ email: inv.email })) return null;
    return inv;
  }
}

function toView(i: Invitation, invitedByName: string | null): InvitationView {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    createdAt: i.createdAt.toISOString(),
    expiresAt: i.expiresAt.toISOString(),
    invitedByName,
  };
}

function toMember(u: User): TeamMember {
  return {
    id: u.id,
    name: u.name,
    email: u.email,
    role: u.role as StaffRole,
    createdAt: u.createdAt.toISOString(),
  };
}
