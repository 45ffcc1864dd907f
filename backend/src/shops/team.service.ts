import {
  ConflictException,
  Injectable,
  Logger,
  NotFoundException,
  ServiceUnavailableException,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { IsNull, MoreThan, type DataSource, type Repository } from 'typeorm';
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
import type { RequestUser } from '../common/decorators/current-user.decorator';
import type { AppConfig, AuthConfig } from '../config/app.config';
import { MailService } from '../mail/mail.service';
import { invitationMail } from '../mail/templates';
import type { User } from '../users/user.entity';
import { UsersService } from '../users/users.service';
import { Invitation } from './invitation.entity';
import { ShopsService } from './shops.service';

const notFound = (): NotFoundException =>
  new NotFoundException('This invitation is not valid any more: it was used, replaced or has expired.');

/** A shop's staff and the owner's invitations by e-mail (`/join?token=…`, only the token's hash is kept). */
@Injectable()
export class TeamService {
  private readonly logger = new Logger(TeamService.name);
  private readonly appUrl: string;
  private readonly ttlHours: number;

  constructor(
    @InjectRepository(Invitation) private readonly invitations: Repository<Invitation>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly shops: ShopsService,
    private readonly users: UsersService,
    private readonly hasher: PasswordHasher,
    private readonly mail: MailService,
    config: ConfigService,
  ) {
    this.appUrl = config.getOrThrow<AppConfig>('app').url.replace(/\/+$/, '');
    this.ttlHours = config.getOrThrow<AuthConfig>('auth').invitationTtlHours;
  }

  /** The staff of the signed-in user's shop and the invitations still open. */
  async team(staff: RequestUser): Promise<TeamResponse> {
    const shop = await this.shops.getById(staff.shopId!);
    const [members, open] = await Promise.all([
      this.users.staffOf(shop.id),
      this.invitations.find({
        where: {
          shopId: shop.id,
          acceptedAt: IsNull(),
          revokedAt: IsNull(),
          expiresAt: MoreThan(new Date()),
        },
        relations: { invitedBy: true },
        order: { createdAt: 'DESC' },
      }),
    ]);
    return {
      shop: this.shops.toSummary(shop),
      members: members.map(toMember),
      invitations: open.map((i) => toView(i, i.invitedBy?.name ?? null)),
    };
  }

  /**
   * An owner invites someone to the shop's staff. A newer invitation to the same address replaces
   * the older one. 409 when the address already has an account (one account, one role).
   */
  async invite(owner: RequestUser, email: string, role: StaffRole): Promise<InvitationView> {
    const shop = await this.shops.getById(owner.shopId!);
    if (await this.users.findByEmail(email)) {
      throw new ConflictException('This address already has a Loamline account.');
    }
    const token = newLinkToken();
    const expiresAt = new Date(Date.now() + this.ttlHours * 3_600_000);
    const invitation = await this.dataSource.transaction(async (manager) => {
      const repo = manager.getRepository(Invitation);
      await repo.update(
        { shopId: shop.id, email, acceptedAt: IsNull(), revokedAt: IsNull() },
        { revokedAt: new Date() },
      );
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
      return repo.findOneByOrFail({ id: created.id });
    });
    const link = `${this.appUrl}/join?token=${encodeURIComponent(token)}`;
    try {
      await this.mail.send(invitationMail(email, shop.name, role, owner.name, link, expiresAt));
    } catch (err) {
      this.logger.error(`Could not send an invitation: ${err instanceof Error ? err.message : String(err)}`);
      await this.invitations.delete({ id: invitation.id });
      throw new ServiceUnavailableException(
        'The invitation e-mail could not be sent; try again in a moment.',
      );
    }
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
    const now = new Date();
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
      return this.users.create(
        { email: inv.email, name, role: inv.role, shopId: inv.shopId, passwordHash },
        manager,
      );
    });
  }

  private async findOpen(token: string): Promise<Invitation | null> {
    if (!LINK_TOKEN.test(token)) return null;
    return this.invitations.findOneBy({
      tokenHash: hashLinkToken(token),
      acceptedAt: IsNull(),
      revokedAt: IsNull(),
      expiresAt: MoreThan(new Date()),
    });
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
