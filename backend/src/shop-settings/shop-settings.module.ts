import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClosureEntity } from '../shops/closure.entity';
import { OpeningIntervalEntity } from '../shops/opening-interval.entity';
import { Shop } from '../shops/shop.entity';
import { AvailabilityCache } from './availability-cache';
import { ShopSettingsService } from './shop-settings.service';
import { WorkshopSettingsController } from './workshop-settings.controller';

/** A shop's hours, closures, benches and booking rules. */
@Module({
  imports: [TypeOrmModule.forFeature([Shop, OpeningIntervalEntity, ClosureEntity])],
  controllers: [WorkshopSettingsController],
  providers: [ShopSettingsService, AvailabilityCache],
  exports: [ShopSettingsService, AvailabilityCache],
})
export class ShopSettingsModule {}
