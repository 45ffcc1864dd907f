import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AppointmentsModule } from '../appointments/appointments.module';
import { AuthModule } from '../auth/auth.module';
import { MailModule } from '../mail/mail.module';
import { ShopServicesModule } from '../shop-services/shop-services.module';
import { Invitation } from './invitation.entity';
import { InvitationsController } from './invitations.controller';
import { Shop } from './shop.entity';
import { ShopsController } from './shops.controller';
import { ShopsService } from './shops.service';
import { TeamController } from './team.controller';
import { TeamService } from './team.service';

/** Shops, their public pages and their staff. */
@Module({
  imports: [
    TypeOrmModule.forFeature([Shop, Invitation]),
    AuthModule,
    MailModule,
    ShopServicesModule,
    AppointmentsModule,
  ],
  controllers: [ShopsController, TeamController, InvitationsController],
  providers: [ShopsService, TeamService],
  exports: [ShopsService],
})
export class ShopsModule {}
