import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AuthModule } from '../auth/auth.module';
import { MailModule } from '../mail/mail.module';
import { Invitation } from './invitation.entity';
import { InvitationsController } from './invitations.controller';
import { Shop } from './shop.entity';
import { ShopsService } from './shops.service';
import { TeamController } from './team.controller';
import { TeamService } from './team.service';

/** Shops and their staff. (Services, hours, benches and rules join here with the booking issues.) */
@Module({
  imports: [TypeOrmModule.forFeature([Shop, Invitation]), AuthModule, MailModule],
  controllers: [TeamController, InvitationsController],
  providers: [ShopsService, TeamService],
  exports: [ShopsService],
})
export class ShopsModule {}
