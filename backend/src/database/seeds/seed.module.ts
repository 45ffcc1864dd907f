import { Module } from '@nestjs/common';
import { BaselineSheetsModule } from '../../baseline-sheets/baseline-sheets.module';
import { BikesModule } from '../../bikes/bikes.module';
import { ShopsModule } from '../../shops/shops.module';
import { UsersModule } from '../../users/users.module';
import { CoreModule } from '../core.module';

/**
 * What the demo seed needs of the app: config, the database and the services that create shops,
 * users, bikes and sheets (the same code the API runs), without an HTTP server.
 */
@Module({
  imports: [CoreModule, UsersModule, ShopsModule, BikesModule, BaselineSheetsModule],
})
export class SeedModule {}
