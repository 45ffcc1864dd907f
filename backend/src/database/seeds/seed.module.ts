import { Module } from '@nestjs/common';
import { BaselineSheetsModule } from '../../baseline-sheets/baseline-sheets.module';
import { BikesModule } from '../../bikes/bikes.module';
import { ShopsModule } from '../../shops/shops.module';
import { UsersModule } from '../../users/users.module';
import { CoreModule } from '../core.module';
import { ClockModule } from '../../common/clock/clock';
import { ShopSettingsModule } from '../../shop-settings/shop-settings.module';
import { ShopServicesModule } from '../../shop-services/shop-services.module';

/**
 * What the demo seed needs of the app: config, the database and the services that create shops,
 * users, bikes, sheets, shop settings and services (the same code the API runs), without an HTTP
 * server.
 */
@Module({
  imports: [
    CoreModule,
    ClockModule,
    UsersModule,
    ShopsModule,
    BikesModule,
    BaselineSheetsModule,
    ShopSettingsModule,
    ShopServicesModule,
  ],
})
export class SeedModule {}
